/**
 * Which waiver, if any, covers a finding. A waiver covers a finding when it is approved, not
 * expired, and matches either the finding's fingerprint (scope `fingerprint`) or its rule and
 * asset path (scope `rule-asset`). Pure, so the gate's exceptions are tested without a database.
 */

/** The parts of a waiver that decide what it covers. */
export interface WaiverTerms {
  id: number;
  scope: 'fingerprint' | 'rule-asset';
  status: string;
  fingerprint: string | null;
  rule: string | null;
  assetPath: string | null;
  expiresAt: Date | null;
}

/** The parts of a finding a waiver is matched on. */
export interface WaivableFinding {
  fingerprint: string;
  rule: string;
  asset: string;
}

/**
 * The waiver covering `finding` at `now`, or null. A fingerprint waiver wins over a rule-asset
 * one (it is the narrower decision), then the oldest waiver wins, so the choice is stable.
 */
export function findWaiver<W extends WaiverTerms>(
  finding: WaivableFinding,
  waivers: readonly W[],
  now: Date
): W | null {
  let best: W | null = null;
  for (const waiver of waivers) {
    if (!isInForce(waiver, now) || !covers(waiver, finding)) continue;
    if (best === null || rank(waiver) < rank(best) || (rank(waiver) === rank(best) && waiver.id < best.id)) {
      best = waiver;
    }
  }
  return best;
}

/** True for an approved waiver whose expiry (if any) is still ahead. */
export function isInForce(waiver: WaiverTerms, now: Date): boolean {
  return waiver.status === 'approved' && (waiver.expiresAt === null || waiver.expiresAt.getTime() > now.getTime());
}

function covers(waiver: WaiverTerms, finding: WaivableFinding): boolean {
  if (waiver.scope === 'fingerprint') return waiver.fingerprint === finding.fingerprint;
  return waiver.rule === finding.rule && waiver.assetPath === finding.asset;
}

function rank(waiver: WaiverTerms): number {
  return waiver.scope === 'fingerprint' ? 0 : 1;
}

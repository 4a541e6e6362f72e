/**
 * Sorting a build's findings against its baseline build: what is new, what was already
 * there, and what the baseline had that is now gone. Pure, so the gate's most important input
 * is tested without a database.
 *
 * Design notes: findings match by fingerprint as a multiset, so two findings sharing a
 * fingerprint in this build against one in the baseline give one `unchanged` and one `new`.
 * A baseline finding counts as `fixed` only when its asset was checked in this build: a build
 * that leaves an asset out (or skips it by policy) says nothing about that asset's defects, and
 * calling them fixed would let a partial upload hide them.
 */

/** Where a finding stands relative to the baseline build. */
export type BaselineStatus = 'new' | 'unchanged' | 'fixed';

/** The least a finding needs to be compared. */
export interface ComparableFinding {
  fingerprint: string;
  asset: string;
}

/** A finding with its place relative to the baseline. Fixed entries carry the baseline's finding. */
export interface ComparedFinding<F extends ComparableFinding> {
  finding: F;
  status: BaselineStatus;
}

/**
 * Compares this build's findings with the baseline's present (not fixed) findings.
 * Returns this build's findings in their order, each `new` or `unchanged`, followed by the
 * baseline findings now absent as `fixed` (only for assets in `checkedAssets`).
 * With no baseline every finding is new.
 *
 * @example
 * compareWithBaseline([a, b], [b, c], new Set(['x.glb']))
 *   → [{a, new}, {b, unchanged}, {c, fixed}]   // when c.asset is x.glb
 */
export function compareWithBaseline<F extends ComparableFinding>(
  current: readonly F[],
  baseline: readonly F[] | null,
  checkedAssets: ReadonlySet<string>
): ComparedFinding<F>[] {
  if (baseline === null) return current.map((finding) => ({ finding, status: 'new' }));

  const available = new Map<string, number>();
  for (const finding of baseline) available.set(finding.fingerprint, (available.get(finding.fingerprint) ?? 0) + 1);

  // Pairs in order: the k-th current finding of a fingerprint matches the k-th baseline one.
  const matched = new Map<string, number>();
  const compared: ComparedFinding<F>[] = current.map((finding) => {
    const used = matched.get(finding.fingerprint) ?? 0;
    if (used >= (available.get(finding.fingerprint) ?? 0)) return { finding, status: 'new' };
    matched.set(finding.fingerprint, used + 1);
    return { finding, status: 'unchanged' };
  });

  for (const finding of baseline) {
    const used = matched.get(finding.fingerprint) ?? 0;
    if (used > 0) {
      matched.set(finding.fingerprint, used - 1);
      continue;
    }
    if (checkedAssets.has(finding.asset)) compared.push({ finding, status: 'fixed' });
  }
  return compared;
}

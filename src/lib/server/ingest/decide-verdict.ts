/**
 * The CI gate's decision for one build: pass or fail, and a one-line reason a developer can
 * act on without opening the report. Pure, so the gate is tested without a server.
 */
import { isAtLeast, SEVERITIES, type Severity } from '$lib/lint/finding';
import type { Policy } from '$lib/lint/policy';
import type { BaselineStatus } from './compare-with-baseline';

/** Outcome of the gate. */
export type Verdict = 'pass' | 'fail';

/** What the gate needs to know about one finding of the build. */
export interface GateFinding {
  rule: string;
  severity: Severity;
  asset: string;
  node: string | null;
  time: number | null;
  status: BaselineStatus;
  /** An approved, unexpired waiver covers the finding: it never counts against the gate. */
  isWaived: boolean;
}

/** The gate's decision with its human reason. */
export interface VerdictDecision {
  verdict: Verdict;
  reason: string;
  /** The findings that failed the gate, in build order (empty on pass). */
  failing: GateFinding[];
}

/** How many failing findings the reason names before summarising the rest. */
const NAMED_IN_REASON = 3;

/**
 * Decides the verdict under the policy's gate: fail when a non-waived finding reaches
 * `gate.failOn` and is new (scope `new`) or present at all (scope `all`). Fixed findings never
 * count. The reason counts the failing findings by severity and names the first few, e.g.
 * `2 new errors: hemisphere-jump in chars/kelp-diver.glb (/Diver/Hips at 1.25 s), unit-drift in props/buoy.glb`.
 */
export function decideVerdict(findings: readonly GateFinding[], gate: Policy['gate']): VerdictDecision {
  const isCounted = (f: GateFinding) =>
    f.status !== 'fixed' &&
    !f.isWaived &&
    isAtLeast(f.severity, gate.failOn) &&
    (gate.scope === 'all' || f.status === 'new');
  const failing = findings.filter(isCounted);
  const qualifier = gate.scope === 'new' ? 'new ' : '';

  if (failing.length > 0) {
    const named = failing.slice(0, NAMED_IN_REASON).map(describe);
    const rest = failing.length - named.length;
    const list = named.join(', ') + (rest > 0 ? ` and ${rest} more` : '');
    return { verdict: 'fail', reason: `${countBySeverity(failing, qualifier)}: ${list}`, failing };
  }

  const present = findings.filter((f) => f.status !== 'fixed');
  const notes = [
    countIf(present, (f) => f.status === 'unchanged' && !f.isWaived, 'unchanged'),
    countIf(present, (f) => f.isWaived, 'waived'),
    countIf(findings, (f) => f.status === 'fixed', 'fixed')
  ].filter((note) => note !== null);
  const base = `No ${qualifier}${gateSeverityWords(gate.failOn)}`;
  return { verdict: 'pass', reason: notes.length > 0 ? `${base} (${notes.join(', ')})` : base, failing: [] };
}

/** `2 new errors, 1 new warning` for the failing findings, heaviest severity first. */
function countBySeverity(failing: readonly GateFinding[], qualifier: string): string {
  return SEVERITIES.map((severity) => {
    const n = failing.filter((f) => f.severity === severity).length;
    return n === 0 ? null : `${n} ${qualifier}${severity}${n === 1 ? '' : 's'}`;
  })
    .filter((part) => part !== null)
    .join(', ');
}

/** `errors`, `errors or warnings`, or `findings`, for the gate's threshold. */
function gateSeverityWords(failOn: Severity): string {
  if (failOn === 'error') return 'errors';
  if (failOn === 'warning') return 'errors or warnings';
  return 'findings';
}

/** `rule in asset (node at 1.25 s)`, leaving out what the finding does not carry. */
function describe(finding: GateFinding): string {
  const where = [finding.node, finding.time === null ? null : `at ${formatSeconds(finding.time)} s`]
    .filter((part) => part !== null)
    .join(' ');
  return `${finding.rule} in ${finding.asset}${where ? ` (${where})` : ''}`;
}

/** Seconds with up to three decimals and no trailing zeros: 1.25, 0.033, 2. */
function formatSeconds(timeSeconds: number): string {
  return String(Math.round(timeSeconds * 1000) / 1000);
}

/** `3 unchanged`, or null when none match. */
function countIf(
  findings: readonly GateFinding[],
  predicate: (f: GateFinding) => boolean,
  label: string
): string | null {
  const n = findings.filter(predicate).length;
  return n === 0 ? null : `${n} ${label}`;
}

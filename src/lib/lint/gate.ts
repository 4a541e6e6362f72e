/**
 * The CI gate's severity test: which findings are heavy enough to fail a build under a policy.
 * Whether only findings new against the baseline count (`gate.scope: new`) is decided by the
 * caller, which knows the baseline; pass it the findings that are in scope.
 */
import { isAtLeast, type Finding } from './finding';
import type { Policy } from './policy';

/** Findings at or above `policy.gate.failOn`, in their given order. */
export function gateFailures(findings: readonly Finding[], policy: Policy): Finding[] {
  return findings.filter((finding) => isAtLeast(finding.severity, policy.gate.failOn));
}

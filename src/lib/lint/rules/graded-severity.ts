/**
 * Severity for rules that grade their own findings (unit-drift: warning or error by size;
 * hemisphere-jump and antipodal-keys: heavier on CUBICSPLINE).
 *
 * The policy wins: when `policy.rules[id]` is set — even to the rule's default — every finding of
 * that rule takes that severity and grading is off. Without an override the rule's natural grade
 * applies. This keeps one predictable answer to "why is this an error?": either the policy says
 * so, or the rule's documented grading does.
 */
import type { Severity } from '../finding';
import type { RuleId } from '../rule-ids';
import type { RuleContext } from './rule';

export function gradedSeverity(context: RuleContext, ruleId: RuleId, natural: Severity): Severity {
  return context.policy.rules[ruleId] === undefined ? natural : context.severity;
}

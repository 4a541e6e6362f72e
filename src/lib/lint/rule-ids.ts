/**
 * Every rule id Orientry knows, in report order. Policies are validated against this list,
 * so it lives apart from the rule implementations (rules/index.ts must list the same ids;
 * a test checks that).
 */
export const RULE_IDS = [
  'asset-unreadable',
  'key-times',
  'rotation-encoding',
  'not-a-rotation',
  'unit-drift',
  'hemisphere-jump',
  'antipodal-keys',
  'wide-arc',
  'spin-spike',
  'spline-dip',
  'baked-basis',
  'clip-basis-offset',
  'mirrored-basis',
  'gimbal-proximity',
  'redundant-keys'
] as const;

export type RuleId = (typeof RULE_IDS)[number];

export function isRuleId(value: string): value is RuleId {
  return (RULE_IDS as readonly string[]).includes(value);
}

/**
 * Orientry's fixes: glTF-Transform transforms that repair what some rules find, and
 * {@link fixDocument}, which applies the ones a policy and a rule list call for.
 *
 * Rules without an entry in {@link FIXES} have no automatic fix, on purpose: a not-a-rotation key
 * (zero length, NaN) has no rotation to recover, so guessing one would hide the bug; the other rules
 * (wide arcs, spin spikes, key times, encodings...) need an animator's decision.
 */
import type { Document, Transform } from '@gltf-transform/core';
import { severityFor, type Policy } from '../policy';
import type { RuleId } from '../rule-ids';
import { RULES } from '../rules/index';
import { breakAntipodalKeys } from './break-antipodal-keys';
import { hasChanges, type FixName, type FixResult } from './fix-result';
import { removeBakedBasis } from './remove-baked-basis';
import { renormalize } from './renormalize';
import { unflipHemispheres } from './unflip-hemispheres';

export { renormalize, RENORMALIZE, RENORMALIZE_DEFAULTS, type RenormalizeOptions } from './renormalize';
export { unflipHemispheres, UNFLIP_HEMISPHERES, type UnflipHemispheresOptions } from './unflip-hemispheres';
export {
  breakAntipodalKeys,
  BREAK_ANTIPODAL_KEYS,
  BREAK_ANTIPODAL_KEYS_DEFAULTS,
  type BreakAntipodalKeysOptions
} from './break-antipodal-keys';
export {
  removeBakedBasis,
  REMOVE_BAKED_BASIS,
  REMOVE_BAKED_BASIS_DEFAULTS,
  type RemoveBakedBasisOptions
} from './remove-baked-basis';
export { previewFixedChannel } from './preview-channel';
export { hasChanges, type FixName, type FixResult } from './fix-result';

/**
 * Which transform factory fixes which rule. Only fixable rules are listed; `Object.keys(FIXES)`
 * is the list of rules `orientry fix --rules` accepts. baked-basis and clip-basis-offset share one
 * transform, which fixDocument runs once with both parts switched as requested.
 */
export const FIXES = {
  'unit-drift': renormalize,
  'baked-basis': removeBakedBasis,
  'clip-basis-offset': removeBakedBasis,
  'hemisphere-jump': unflipHemispheres,
  'antipodal-keys': breakAntipodalKeys
} as const satisfies Partial<Record<RuleId, (options?: never) => Transform>>;

export type FixableRuleId = keyof typeof FIXES;

/** True when a rule id has an automatic fix. */
export function isFixable(rule: string): rule is FixableRuleId {
  return Object.hasOwn(FIXES, rule);
}

/** What fixDocument did. */
export interface FixDocumentResult {
  /** Names of the transforms that changed the document, in the order they ran (empty: nothing to fix). */
  applied: FixName[];
  /** What each transform that ran changed, including those that found nothing. */
  results: FixResult[];
}

/**
 * Applies the fixes for `rules` with the policy's tolerances. Without `rules`, every fixable rule
 * that would report under the policy is fixed (not turned off; baked-basis only when the policy
 * requires glTF basis); rules named explicitly are fixed regardless. The order is fixed:
 * 1. renormalize: the later steps compare and multiply keys, and unit keys keep that exact;
 * 2. removeBakedBasis: turns keys by whole quarter turns, which keeps their dot products, so it can
 *    neither create nor remove a hemisphere jump;
 * 3. unflipHemispheres: makes every consecutive dot product non-negative, antipodal pairs included;
 * 4. breakAntipodalKeys: catches antipodal pairs when hemisphere-jump was not requested.
 * Idempotent: running it on its own output changes nothing.
 *
 * @example const { applied } = await fixDocument(document, policy, ['unit-drift']); // → ['renormalize']
 */
export async function fixDocument(
  document: Document,
  policy: Policy,
  rules?: readonly RuleId[]
): Promise<FixDocumentResult> {
  const wanted = new Set<RuleId>(rules ?? defaultRules(policy));
  const results: FixResult[] = [];
  const collect = (result: FixResult) => results.push(result);
  const { tolerances, convention } = policy;
  const steps: Transform[] = [];
  if (wanted.has('unit-drift'))
    steps.push(
      renormalize({ unitTolerance: tolerances.unitWarning, zeroLength: tolerances.zeroLength, onResult: collect })
    );
  if (wanted.has('baked-basis') || wanted.has('clip-basis-offset'))
    steps.push(
      removeBakedBasis({
        rest: wanted.has('baked-basis'),
        clips: wanted.has('clip-basis-offset'),
        basisToleranceDegrees: convention.basisToleranceDegrees,
        clipOffsetToleranceDegrees: convention.clipOffsetToleranceDegrees,
        onResult: collect
      })
    );
  if (wanted.has('hemisphere-jump')) steps.push(unflipHemispheres({ onResult: collect }));
  if (wanted.has('antipodal-keys'))
    steps.push(breakAntipodalKeys({ tolerance: tolerances.antipodal, onResult: collect }));
  for (const step of steps) await document.transform(step);
  return { applied: results.filter(hasChanges).map((result) => result.fix), results };
}

/** Fixable rules that would report under the policy: not turned off, and baked-basis only when glTF basis is required. */
function defaultRules(policy: Policy): RuleId[] {
  return (Object.keys(FIXES) as FixableRuleId[]).filter((rule) => {
    const defaultSeverity = RULES.find((candidate) => candidate.id === rule)?.defaultSeverity ?? 'warning';
    if (severityFor(policy, rule, defaultSeverity) === 'off') return false;
    return rule !== 'baked-basis' || policy.convention.requireGltfBasis;
  });
}

/**
 * Aligns the sign of antipodal consecutive keys (antipodal-keys): q(k+1) ≈ −q(k) is the same
 * rotation written with the opposite sign. Between such keys a CUBICSPLINE curve passes through
 * the zero quaternion, which is no rotation at all (glTF 2.0 Appendix C asks exporters to make sure
 * v_k ≠ −v_k+1), and a LINEAR player that skips the shortest-path sign spins a full turn.
 *
 * Choice: key k+1 (and, with it, the rest of the tail, see unflip-keys.ts) is negated, so the pair
 * becomes two equal keys: a hold from t_k to t_k+1, which is what the exporter meant. The second key
 * is kept, not removed: it ends the hold, and without it the motion towards key k+2 would start
 * at t_k instead of t_k+1. Removing it would also rewrite the shared input (time) accessor. Keys that
 * are redundant after the fix are redundant-keys' business. STEP samplers are left alone.
 */
import type { Document, Transform } from '@gltf-transform/core';
import { defaultPolicy } from '../policy';
import { withoutUndefined } from './defined-options';
import type { FixResult } from './fix-result';
import { listRotationSamplers } from './rotation-samplers';
import { commitOutputEdits, encodeSamplerCurve, readSamplerCurve, type OutputEdit } from './sampler-output';
import { alignAntipodalKeys } from './unflip-keys';

export const BREAK_ANTIPODAL_KEYS = 'breakAntipodalKeys';

export interface BreakAntipodalKeysOptions {
  /** Largest 4D distance |q(k+1) + q(k)| that counts as antipodal. Default: the policy's tolerances.antipodal. */
  tolerance?: number;
  /** Receives what the transform changed. */
  onResult?: (result: FixResult) => void;
}

export const BREAK_ANTIPODAL_KEYS_DEFAULTS: Required<Omit<BreakAntipodalKeysOptions, 'onResult'>> = {
  tolerance: defaultPolicy().tolerances.antipodal
};

/**
 * A transform that turns every antipodal pair of consecutive keys (LINEAR and CUBICSPLINE rotation
 * samplers) into a pair of equal keys.
 *
 * @example await document.transform(breakAntipodalKeys({ tolerance: 1e-3 }));
 */
export function breakAntipodalKeys(options: BreakAntipodalKeysOptions = {}): Transform {
  const { tolerance } = { ...BREAK_ANTIPODAL_KEYS_DEFAULTS, ...withoutUndefined(options) };
  return function breakAntipodalKeysTransform(document: Document): void {
    const edits: OutputEdit[] = [];
    let keysChanged = 0;
    for (const sampler of listRotationSamplers(document)) {
      const output = sampler.getOutput();
      if (sampler.getInterpolation() === 'STEP' || !output) continue;
      const curve = readSamplerCurve(sampler);
      if (!curve) continue;
      const changed = alignAntipodalKeys(curve, tolerance);
      if (changed === 0) continue;
      keysChanged += changed;
      edits.push({ sampler, array: encodeSamplerCurve(sampler, curve) });
    }
    const counts = commitOutputEdits(document, edits);
    options.onResult?.({ fix: 'breakAntipodalKeys', keysChanged, nodesChanged: 0, ...counts });
  };
}

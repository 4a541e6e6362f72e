/**
 * Negates rotation keys so consecutive keys never lie in opposite hemispheres (hemisphere-jump).
 * A player that interpolates the stored numbers directly (CUBICSPLINE always does; a LINEAR player
 * that skips the shortest-path sign of glTF 2.0 Appendix C does too) takes the long way round when
 * q_k·q_k+1 < 0: a spin of up to 360° the animator never made. Negating a key is the same rotation,
 * so poses at the keys do not change. The walk keeps a running sign (see unflip-keys.ts) and negates
 * CUBICSPLINE tangents with their key. STEP samplers are left alone: nothing is interpolated between
 * their keys, so the sign cannot matter.
 */
import type { Document, Transform } from '@gltf-transform/core';
import type { FixResult } from './fix-result';
import { listRotationSamplers } from './rotation-samplers';
import { commitOutputEdits, encodeSamplerCurve, readSamplerCurve, type OutputEdit } from './sampler-output';
import { unflipKeys } from './unflip-keys';

export const UNFLIP_HEMISPHERES = 'unflipHemispheres';

export interface UnflipHemispheresOptions {
  /** Receives what the transform changed. */
  onResult?: (result: FixResult) => void;
}

/**
 * A transform that makes q_k·q_k+1 ≥ 0 for every pair of consecutive keys of every LINEAR and
 * CUBICSPLINE rotation sampler.
 *
 * @example await document.transform(unflipHemispheres());
 */
export function unflipHemispheres(options: UnflipHemispheresOptions = {}): Transform {
  return function unflipHemispheresTransform(document: Document): void {
    const edits: OutputEdit[] = [];
    let keysChanged = 0;
    for (const sampler of listRotationSamplers(document)) {
      if (sampler.getInterpolation() === 'STEP') continue;
      const curve = readSamplerCurve(sampler);
      if (!curve) continue;
      const changed = unflipKeys(curve);
      if (changed === 0) continue;
      keysChanged += changed;
      edits.push({ sampler, array: encodeSamplerCurve(sampler, curve) });
    }
    const counts = commitOutputEdits(document, edits);
    options.onResult?.({ fix: 'unflipHemispheres', keysChanged, nodesChanged: 0, ...counts });
  };
}

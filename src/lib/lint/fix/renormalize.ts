/**
 * Renormalizes rotation keys and node rest rotations whose length drifted from 1 (unit-drift).
 * A quaternion of length 1 + e applied as q·v·q* scales v by (1 + e)², so drift shows as limbs that
 * stretch; dividing by the length removes it without changing the rotation. Keys within tolerance,
 * and accessors without a drifting key, are left bit-for-bit alone.
 *
 * Quantized outputs are re-encoded to their own component type with the glTF 2.0 §3.11 formulas.
 * A unit quaternion rounded that way can still miss length 1 by up to one quantization step
 * (four components each off by at most half a step: |Δ| ≤ √4 · step/2), so for them the tolerance
 * grows to two steps, as unit-drift's does: a key the fix re-encoded is never flagged again, and a
 * second run finds nothing to re-round (the fix is idempotent).
 * CUBICSPLINE tangents are scaled with their key; see renormalize-keys.ts for why.
 */
import type { Document, Transform } from '@gltf-transform/core';
import { defaultPolicy } from '../policy';
import { withoutUndefined } from './defined-options';
import type { FixResult } from './fix-result';
import { quantizationStepFor } from './normalized-int';
import { renormalizeKeys } from './renormalize-keys';
import { listRotationSamplers } from './rotation-samplers';
import { commitOutputEdits, encodeSamplerCurve, readSamplerCurve, type OutputEdit } from './sampler-output';

export const RENORMALIZE = 'renormalize';

export interface RenormalizeOptions {
  /** Keys and rest rotations with |length − 1| above this are renormalized. Default: the policy's unitWarning. */
  unitTolerance?: number;
  /** Shorter than this is no rotation (not-a-rotation) and is left alone. Default: the policy's zeroLength. */
  zeroLength?: number;
  /** Receives what the transform changed. */
  onResult?: (result: FixResult) => void;
}

const policyTolerances = defaultPolicy().tolerances;

export const RENORMALIZE_DEFAULTS: Required<Omit<RenormalizeOptions, 'onResult'>> = {
  unitTolerance: policyTolerances.unitWarning,
  zeroLength: policyTolerances.zeroLength
};

/**
 * A transform that renormalizes drifting rotation keys (every rotation sampler) and node rotations.
 *
 * @example await document.transform(renormalize({ unitTolerance: 1e-4 }));
 */
export function renormalize(options: RenormalizeOptions = {}): Transform {
  const { unitTolerance, zeroLength } = { ...RENORMALIZE_DEFAULTS, ...withoutUndefined(options) };
  return function renormalizeTransform(document: Document): void {
    const edits: OutputEdit[] = [];
    let keysChanged = 0;
    for (const sampler of listRotationSamplers(document)) {
      const curve = readSamplerCurve(sampler);
      const output = sampler.getOutput();
      if (!curve || !output) continue;
      const step = quantizationStepFor(output.getComponentType(), output.getNormalized());
      const changed = renormalizeKeys(curve, { unitTolerance: Math.max(unitTolerance, 2 * step), zeroLength });
      if (changed === 0) continue;
      keysChanged += changed;
      edits.push({ sampler, array: encodeSamplerCurve(sampler, curve) });
    }
    const counts = commitOutputEdits(document, edits);

    let nodesChanged = 0;
    for (const node of document.getRoot().listNodes()) {
      const [x, y, z, w] = node.getRotation();
      const length = Math.hypot(x, y, z, w);
      if (!Number.isFinite(length) || length < zeroLength || Math.abs(length - 1) <= unitTolerance) continue;
      node.setRotation([x / length, y / length, z / length, w / length]);
      nodesChanged++;
    }
    options.onResult?.({ fix: 'renormalize', keysChanged, nodesChanged, ...counts });
  };
}

/**
 * Divides each drifting rotation key by its length, CUBICSPLINE tangents by the same length.
 *
 * Why the tangents take the key's factor: the player normalizes the interpolated quaternion
 * (glTF 2.0 Appendix C), so only the curve's direction matters. Near key k the curve is
 * v_k + b_k·Δt, and the angular velocity there is the part of b_k orthogonal to v_k divided by
 * |v_k|. Scaling v_k, a_k and b_k by the same 1/|v_k| keeps that direction and that velocity
 * exactly, so the fix changes the stored numbers but not the motion at the keys. Projecting the
 * tangents onto the sphere instead would also keep the velocity but reshapes the curve between
 * keys (and the spline-dip rule measures that shape), so it was rejected.
 */
import type { KeyCurve } from './key-curve';
import { scaleKey } from './key-curve';

export interface RenormalizeKeysOptions {
  /** Keys with |length − 1| above this are renormalized; the others are left bit-for-bit alone. */
  unitTolerance: number;
  /** Keys shorter than this are no rotation at all (not-a-rotation): there is nothing to divide by. */
  zeroLength: number;
}

/**
 * Renormalizes the keys of `curve` whose length strays more than `unitTolerance` from 1, in place.
 * Returns the number of keys changed. Non-finite and near-zero keys are skipped.
 */
export function renormalizeKeys(curve: KeyCurve, options: RenormalizeKeysOptions): number {
  let changed = 0;
  const { values } = curve;
  for (let keyIndex = 0; keyIndex < curve.keyCount; keyIndex++) {
    const offset = keyIndex * 4;
    const length = Math.hypot(values[offset], values[offset + 1], values[offset + 2], values[offset + 3]);
    if (!Number.isFinite(length) || length < options.zeroLength) continue;
    if (Math.abs(length - 1) <= options.unitTolerance) continue;
    scaleKey(curve, keyIndex, 1 / length);
    changed++;
  }
  return changed;
}

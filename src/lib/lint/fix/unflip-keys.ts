/**
 * Sign fixes for rotation keys. q and −q are the same rotation, so negating a key never changes
 * the pose at that key; what changes is the path interpolation takes to the next one. Both fixes
 * walk the keys with a running sign: when the next key (times the running sign) points into the
 * other hemisphere than the key before it, the sign flips, and every later key is negated with it.
 * Negating the whole tail, rather than one key, keeps every later pair exactly as it was: a single
 * negated key would just move the jump one key further on. CUBICSPLINE tangents are negated with
 * their key, since the curve through the negated tail is the negated curve.
 */
import type { KeyCurve } from './key-curve';
import { scaleKey } from './key-curve';

/**
 * Makes every consecutive dot product non-negative (hemisphere-jump), in place.
 * Returns the number of keys changed. Keys with a non-finite component are left as they are.
 */
export function unflipKeys(curve: KeyCurve): number {
  return walkSigns(curve, (dot) => dot < 0);
}

/**
 * Aligns the sign of keys that are the antipode of the key before them (antipodal-keys), in place:
 * where q(k+1) ≈ −q(k) within `tolerance` (4D distance |q(k+1) + q(k)|), key k+1 and the rest of the
 * tail are negated, so the pair becomes two equal keys: a hold, which is what the exporter meant
 * (glTF 2.0 Appendix C asks exporters to avoid v_k = −v_k+1 because the spline passes through zero).
 * Other negative dot products are left alone; unflipKeys handles those. Returns the keys changed.
 */
export function alignAntipodalKeys(curve: KeyCurve, tolerance: number): number {
  const toleranceSquared = tolerance * tolerance;
  return walkSigns(curve, (_dot, antipodeDistanceSquared) => antipodeDistanceSquared <= toleranceSquared);
}

function walkSigns(curve: KeyCurve, shouldFlip: (dot: number, antipodeDistanceSquared: number) => boolean): number {
  const { values } = curve;
  let sign = 1;
  let changed = 0;
  for (let keyIndex = 0; keyIndex < curve.keyCount; keyIndex++) {
    const offset = keyIndex * 4;
    // Like the rules, only a pair of finite keys says anything about the path between them.
    if (!isFiniteKey(values, offset)) continue;
    if (keyIndex > 0 && isFiniteKey(values, offset - 4)) {
      let dot = 0;
      let previousLengthSquared = 0;
      let currentLengthSquared = 0;
      for (let component = 0; component < 4; component++) {
        const previous = values[offset - 4 + component];
        const current = sign * values[offset + component];
        dot += previous * current;
        previousLengthSquared += previous * previous;
        currentLengthSquared += current * current;
      }
      // |p + c|² written as the antipodal-keys rule writes it, so both agree at the threshold.
      if (shouldFlip(dot, previousLengthSquared + currentLengthSquared + 2 * dot)) sign = -sign;
    }
    if (sign < 0) {
      scaleKey(curve, keyIndex, -1);
      changed++;
    }
  }
  return changed;
}

function isFiniteKey(values: Float64Array, offset: number): boolean {
  return (
    Number.isFinite(values[offset]) &&
    Number.isFinite(values[offset + 1]) &&
    Number.isFinite(values[offset + 2]) &&
    Number.isFinite(values[offset + 3])
  );
}

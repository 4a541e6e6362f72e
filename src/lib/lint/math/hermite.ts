/**
 * The cubic Hermite segment of glTF 2.0 Appendix C, un-normalized:
 *   p(t) = (2t³−3t²+1)·v_k + t_d(t³−2t²+t)·b_k + (−2t³+3t²)·v_k+1 + t_d(t³−t²)·a_k+1
 * where b_k is key k's out-tangent, a_k+1 the next key's in-tangent and t_d the segment duration.
 * The spec normalizes the result before applying it to a rotation; rules look at the raw curve
 * because its length shows how far the curve sags towards the zero quaternion.
 */

/** Largest |h10(t)| = |t³−2t²+t| on [0, 1] (at t = 1/3); also the largest |h11(t)| (at t = 2/3). */
export const HERMITE_TANGENT_WEIGHT_MAX = 4 / 27;

/**
 * Evaluates the segment at t ∈ [0, 1] into `out` (x, y, z, w).
 * `values` holds v_k at `fromOffset` and v_k+1 at `toOffset`; the tangent arrays use the same offsets.
 */
export function hermiteInto(
  out: Float64Array,
  values: ArrayLike<number>,
  outTangents: ArrayLike<number>,
  inTangents: ArrayLike<number>,
  fromOffset: number,
  toOffset: number,
  durationSeconds: number,
  t: number
): Float64Array {
  const t2 = t * t;
  const t3 = t2 * t;
  const h00 = 2 * t3 - 3 * t2 + 1;
  const h10 = durationSeconds * (t3 - 2 * t2 + t);
  const h01 = -2 * t3 + 3 * t2;
  const h11 = durationSeconds * (t3 - t2);
  for (let c = 0; c < 4; c++) {
    out[c] =
      h00 * values[fromOffset + c] +
      h10 * outTangents[fromOffset + c] +
      h01 * values[toOffset + c] +
      h11 * inTangents[toOffset + c];
  }
  return out;
}

/**
 * The time derivative (per second) of the same segment at t ∈ [0, 1], into `out`:
 * p'(t) = ((6t²−6t)·v_k + t_d(3t²−4t+1)·b_k + (−6t²+6t)·v_k+1 + t_d(3t²−2t)·a_k+1) / t_d.
 */
export function hermiteVelocityInto(
  out: Float64Array,
  values: ArrayLike<number>,
  outTangents: ArrayLike<number>,
  inTangents: ArrayLike<number>,
  fromOffset: number,
  toOffset: number,
  durationSeconds: number,
  t: number
): Float64Array {
  const t2 = t * t;
  const d00 = (6 * t2 - 6 * t) / durationSeconds;
  const d10 = 3 * t2 - 4 * t + 1;
  const d01 = (-6 * t2 + 6 * t) / durationSeconds;
  const d11 = 3 * t2 - 2 * t;
  for (let c = 0; c < 4; c++) {
    out[c] =
      d00 * values[fromOffset + c] +
      d10 * outTangents[fromOffset + c] +
      d01 * values[toOffset + c] +
      d11 * inTangents[toOffset + c];
  }
  return out;
}

/**
 * Spherical linear interpolation exactly as glTF 2.0 Appendix C writes it: a = acos(|v_k·v_k+1|),
 * s = sign(v_k·v_k+1), v_t = sin(a(1−t))/sin(a)·v_k + s·sin(at)/sin(a)·v_k+1. Used where a rule needs
 * the value a conforming player shows between two LINEAR keys (redundant-keys).
 * Inputs are expected unit length; when a is tiny it falls back to the linear form, as the
 * appendix's implementation note allows.
 */
export function slerpInto(
  out: Float64Array,
  a: ArrayLike<number>,
  aOffset: number,
  b: ArrayLike<number>,
  bOffset: number,
  t: number
): Float64Array {
  const ax = a[aOffset];
  const ay = a[aOffset + 1];
  const az = a[aOffset + 2];
  const aw = a[aOffset + 3];
  let bx = b[bOffset];
  let by = b[bOffset + 1];
  let bz = b[bOffset + 2];
  let bw = b[bOffset + 3];
  let dot = ax * bx + ay * by + az * bz + aw * bw;
  if (dot < 0) {
    dot = -dot;
    bx = -bx;
    by = -by;
    bz = -bz;
    bw = -bw;
  }
  let weightA = 1 - t;
  let weightB = t;
  if (dot < 1 - 1e-9) {
    const angle = Math.acos(dot);
    const sine = Math.sin(angle);
    weightA = Math.sin(angle * (1 - t)) / sine;
    weightB = Math.sin(angle * t) / sine;
  }
  out[0] = weightA * ax + weightB * bx;
  out[1] = weightA * ay + weightB * by;
  out[2] = weightA * az + weightB * bz;
  out[3] = weightA * aw + weightB * bw;
  return out;
}

/**
 * The rotation angle in radians between two quaternions stored in flat arrays, 2·acos(|â·b̂|):
 * the angle a slerp that takes the short path (glTF 2.0 Appendix C) turns through.
 * Works on un-normalized input; returns NaN when either quaternion has zero length or is not finite.
 *
 * @example keyAngleRadians([0, 0, 0, 1], 0, [0, 0, Math.SQRT1_2, Math.SQRT1_2], 0) → π/2
 */
export function keyAngleRadians(a: ArrayLike<number>, aOffset: number, b: ArrayLike<number>, bOffset: number): number {
  const ax = a[aOffset];
  const ay = a[aOffset + 1];
  const az = a[aOffset + 2];
  const aw = a[aOffset + 3];
  const bx = b[bOffset];
  const by = b[bOffset + 1];
  const bz = b[bOffset + 2];
  const bw = b[bOffset + 3];
  const lengthProduct = Math.sqrt((ax * ax + ay * ay + az * az + aw * aw) * (bx * bx + by * by + bz * bz + bw * bw));
  if (!(lengthProduct > 0) || lengthProduct === Infinity) return NaN;
  const cosine = Math.abs(ax * bx + ay * by + az * bz + aw * bw) / lengthProduct;
  // Rounding can push |cos| a hair past 1 for identical keys.
  return 2 * Math.acos(cosine > 1 ? 1 : cosine);
}

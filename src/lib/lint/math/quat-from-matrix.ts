/**
 * The rotation of a column-major 4×4 transform (glTF 2.0 §3.5.3 `matrix` layout) as a unit
 * quaternion (x, y, z, w), after dividing each basis column by its length to remove scale.
 * Returns null when a column has zero length or the 3×3 part mirrors (negative determinant):
 * a mirror is no rotation, and mirrored-basis reports it instead.
 */
export function quatFromMatrix(matrix: ArrayLike<number>): [number, number, number, number] | null {
  const sx = Math.hypot(matrix[0], matrix[1], matrix[2]);
  const sy = Math.hypot(matrix[4], matrix[5], matrix[6]);
  const sz = Math.hypot(matrix[8], matrix[9], matrix[10]);
  if (!(sx > 0 && sy > 0 && sz > 0)) return null;
  // r{row}{column} of the scale-free 3×3 part.
  const r11 = matrix[0] / sx;
  const r21 = matrix[1] / sx;
  const r31 = matrix[2] / sx;
  const r12 = matrix[4] / sy;
  const r22 = matrix[5] / sy;
  const r32 = matrix[6] / sy;
  const r13 = matrix[8] / sz;
  const r23 = matrix[9] / sz;
  const r33 = matrix[10] / sz;
  const determinant = r11 * (r22 * r33 - r23 * r32) - r12 * (r21 * r33 - r23 * r31) + r13 * (r21 * r32 - r22 * r31);
  if (!(determinant > 0)) return null;
  // Shepperd's method: branch on the largest diagonal term for a well-conditioned square root.
  const trace = r11 + r22 + r33;
  let x: number, y: number, z: number, w: number;
  if (trace > 0) {
    const s = 2 * Math.sqrt(trace + 1);
    w = s / 4;
    x = (r32 - r23) / s;
    y = (r13 - r31) / s;
    z = (r21 - r12) / s;
  } else if (r11 > r22 && r11 > r33) {
    const s = 2 * Math.sqrt(1 + r11 - r22 - r33);
    w = (r32 - r23) / s;
    x = s / 4;
    y = (r12 + r21) / s;
    z = (r13 + r31) / s;
  } else if (r22 > r33) {
    const s = 2 * Math.sqrt(1 + r22 - r11 - r33);
    w = (r13 - r31) / s;
    x = (r12 + r21) / s;
    y = s / 4;
    z = (r23 + r32) / s;
  } else {
    const s = 2 * Math.sqrt(1 + r33 - r11 - r22);
    w = (r21 - r12) / s;
    x = (r13 + r31) / s;
    y = (r23 + r32) / s;
    z = s / 4;
  }
  const length = Math.hypot(x, y, z, w);
  return [x / length, y / length, z / length, w / length];
}

/**
 * The Hamilton product a·b of two quaternions (x, y, z, w): the rotation b followed by a.
 * Rules use it to compare keys with a node's rest rotation (clip-basis-offset).
 */
export function multiplyQuat(
  out: Float64Array,
  ax: number,
  ay: number,
  az: number,
  aw: number,
  bx: number,
  by: number,
  bz: number,
  bw: number
): Float64Array {
  out[0] = aw * bx + ax * bw + ay * bz - az * by;
  out[1] = aw * by - ax * bz + ay * bw + az * bx;
  out[2] = aw * bz + ax * by - ay * bx + az * bw;
  out[3] = aw * bw - ax * bx - ay * by - az * bz;
  return out;
}

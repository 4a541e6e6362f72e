/**
 * The numbers the asset view plots and tabulates for a rotation channel's keys: components,
 * quaternion length, angular speed between keys, and each key's dot product and angle with the
 * key before it. Pure, so the "after fix" preview gets exactly the same treatment as the stored keys.
 */

/** A channel's keys as plot series. Arrays are per key except `speedDegreesPerSecond`, per segment k → k+1. */
export interface KeySeries {
  times: number[];
  x: number[];
  y: number[];
  z: number[];
  w: number[];
  /** |q| per key. */
  length: number[];
  /** Angular speed from key k to k+1 along the shorter arc; null where time does not advance or a key has no length. */
  speedDegreesPerSecond: (number | null)[];
}

/** The series of keys given as times and interleaved x, y, z, w values (4 per key). */
export function keySeriesOf(times: ArrayLike<number>, values: ArrayLike<number>, keyCount: number): KeySeries {
  const series: KeySeries = { times: [], x: [], y: [], z: [], w: [], length: [], speedDegreesPerSecond: [] };
  for (let key = 0; key < keyCount; key++) {
    const q = quaternionAt(values, key);
    series.times.push(times[key]);
    series.x.push(q[0]);
    series.y.push(q[1]);
    series.z.push(q[2]);
    series.w.push(q[3]);
    series.length.push(Math.hypot(...q));
  }
  for (let key = 0; key + 1 < keyCount; key++) {
    const seconds = times[key + 1] - times[key];
    const degrees = angleDegrees(quaternionAt(values, key), quaternionAt(values, key + 1));
    series.speedDegreesPerSecond.push(seconds > 0 && degrees !== null ? degrees / seconds : null);
  }
  return series;
}

/** The 4D dot product a·b of two quaternions (x, y, z, w). Negative means b sits in the other hemisphere. */
export function dot(a: readonly number[], b: readonly number[]): number {
  return a[0] * b[0] + a[1] * b[1] + a[2] * b[2] + a[3] * b[3];
}

/**
 * The rotation angle in degrees between two quaternions along the shorter arc: 2·acos(|a·b| / (|a||b|)).
 * glTF 2.0 Appendix C interpolates rotations with slerp along the shorter path, so this is the turn a
 * player shows between the two keys. Null when either has zero length.
 */
export function angleDegrees(a: readonly number[], b: readonly number[]): number | null {
  const lengths = Math.hypot(a[0], a[1], a[2], a[3]) * Math.hypot(b[0], b[1], b[2], b[3]);
  if (!(lengths > 0)) return null;
  const cosine = Math.min(1, Math.abs(dot(a, b)) / lengths);
  return (2 * Math.acos(cosine) * 180) / Math.PI;
}

/** Key `key` of interleaved values as [x, y, z, w]. */
export function quaternionAt(values: ArrayLike<number>, key: number): [number, number, number, number] {
  return [values[key * 4], values[key * 4 + 1], values[key * 4 + 2], values[key * 4 + 3]];
}

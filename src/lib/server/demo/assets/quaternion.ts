/**
 * Small quaternion helpers for the demo asset generators, in glTF's (x, y, z, w) order.
 * The generators keep their own math (rather than borrowing gl-matrix) so the tests can use
 * gl-matrix as an independent oracle of what was generated.
 */

/** A quaternion as (x, y, z, w), the order glTF stores rotations in (spec §3.5.2). */
export type Quat = [number, number, number, number];

/** A 3D vector or axis. */
export type Vec3 = [number, number, number];

/** The identity rotation. */
export const IDENTITY: Readonly<Quat> = [0, 0, 0, 1];

/** Unit axes by name, for readable motion tables. */
export const AXES: Readonly<Record<'x' | 'y' | 'z', Vec3>> = { x: [1, 0, 0], y: [0, 1, 0], z: [0, 0, 1] };

/** The rotation by `angleRadians` about a unit `axis` (right-hand rule). */
export function fromAxisAngle(axis: Readonly<Vec3>, angleRadians: number): Quat {
  const s = Math.sin(angleRadians / 2);
  return [axis[0] * s, axis[1] * s, axis[2] * s, Math.cos(angleRadians / 2)];
}

/** The Hamilton product a·b: rotate by b first, then by a. */
export function multiply(a: Readonly<Quat>, b: Readonly<Quat>): Quat {
  const [ax, ay, az, aw] = a;
  const [bx, by, bz, bw] = b;
  return [
    aw * bx + ax * bw + ay * bz - az * by,
    aw * by - ax * bz + ay * bw + az * bx,
    aw * bz + ax * by - ay * bx + az * bw,
    aw * bw - ax * bx - ay * by - az * bz
  ];
}

/** The 4D dot product. */
export function dot(a: Readonly<Quat>, b: Readonly<Quat>): number {
  return a[0] * b[0] + a[1] * b[1] + a[2] * b[2] + a[3] * b[3];
}

/** The 4D length. */
export function length(q: Readonly<Quat>): number {
  return Math.sqrt(dot(q, q));
}

/** q scaled to unit length (the identity for a zero quaternion). */
export function normalize(q: Readonly<Quat>): Quat {
  const n = length(q);
  return n === 0 ? [0, 0, 0, 1] : [q[0] / n, q[1] / n, q[2] / n, q[3] / n];
}

/** -q: the same rotation from the other hemisphere. */
export function negate(q: Readonly<Quat>): Quat {
  return [-q[0], -q[1], -q[2], -q[3]];
}

/** The angle in degrees of the rotation taking a to b (sign-blind, as rotations are). */
export function angleBetweenDegrees(a: Readonly<Quat>, b: Readonly<Quat>): number {
  const cosine = Math.min(1, Math.abs(dot(a, b)) / (length(a) * length(b)));
  return (2 * Math.acos(cosine) * 180) / Math.PI;
}

/**
 * Spherical linear interpolation along the arc the keys define (no shortest-path flip), as
 * glTF LINEAR rotation channels are played (spec Appendix C).
 */
export function slerp(a: Readonly<Quat>, b: Readonly<Quat>, t: number): Quat {
  const cosine = Math.max(-1, Math.min(1, dot(a, b)));
  const theta = Math.acos(cosine);
  if (theta < 1e-9)
    return normalize([
      a[0] + (b[0] - a[0]) * t,
      a[1] + (b[1] - a[1]) * t,
      a[2] + (b[2] - a[2]) * t,
      a[3] + (b[3] - a[3]) * t
    ]);
  const sinTheta = Math.sin(theta);
  const wa = Math.sin((1 - t) * theta) / sinTheta;
  const wb = Math.sin(t * theta) / sinTheta;
  return [a[0] * wa + b[0] * wb, a[1] * wa + b[1] * wb, a[2] * wa + b[2] * wb, a[3] * wa + b[3] * wb];
}

/** Rotates vector v by unit quaternion q (q v q*). */
export function rotateVector(q: Readonly<Quat>, v: Readonly<Vec3>): Vec3 {
  const r = multiply(multiply(q, [v[0], v[1], v[2], 0]), [-q[0], -q[1], -q[2], q[3]]);
  return [r[0], r[1], r[2]];
}

import { glMatrix, quat, vec3 } from 'gl-matrix';
import { describe, expect, test } from 'vitest';
import {
  angleBetweenDegrees,
  fromAxisAngle,
  length,
  multiply,
  negate,
  normalize,
  rotateVector,
  slerp
} from './quaternion';

// gl-matrix defaults to Float32Array; plain arrays keep the oracle in double precision.
glMatrix.setMatrixArrayType(Array);

const TOLERANCE = 1e-12;
const toArray = (q: ArrayLike<number>) => Array.from(q);

describe('quaternion helpers', () => {
  test('fromAxisAngle matches gl-matrix quat.setAxisAngle', () => {
    // Oracle: gl-matrix quat.setAxisAngle (right-hand rule, (x, y, z, w) order).
    const expected = quat.setAxisAngle(quat.create(), [0, 0.6, 0.8], 1.1);
    fromAxisAngle([0, 0.6, 0.8], 1.1).forEach((v, i) => expect(v).toBeCloseTo(expected[i], 12));
  });

  test('multiply is the Hamilton product, as gl-matrix quat.multiply computes it', () => {
    const a = fromAxisAngle([1, 0, 0], 0.7);
    const b = normalize([0.1, -0.4, 0.3, 0.8]);
    // Oracle: gl-matrix quat.multiply (Hamilton product a·b).
    const expected = toArray(quat.multiply(quat.create(), a, b));
    multiply(a, b).forEach((v, i) => expect(Math.abs(v - expected[i])).toBeLessThan(TOLERANCE));
  });

  test('slerp agrees with gl-matrix quat.slerp when the keys share a hemisphere', () => {
    const a = fromAxisAngle([0, 1, 0], 0.2);
    const b = fromAxisAngle([0.6, 0.8, 0], 1.9);
    for (const t of [0, 0.25, 0.5, 0.9, 1]) {
      // Oracle: gl-matrix quat.slerp (Shoemake's slerp; it only differs for a negative dot).
      const expected = toArray(quat.slerp(quat.create(), a, b, t));
      slerp(a, b, t).forEach((v, i) => expect(Math.abs(v - expected[i])).toBeLessThan(1e-9));
    }
  });

  test('slerp follows the stored arc even across hemispheres, unlike a shortest-path slerp', () => {
    const a = fromAxisAngle([0, 1, 0], 0);
    const b = negate(fromAxisAngle([0, 1, 0], 0.5));
    // The midpoint of the long arc lies a quarter turn of 4D angle from both ends: dot ≈ cos(π/2 - 0.125).
    const mid = slerp(a, b, 0.5);
    expect(length(mid)).toBeCloseTo(1, 12);
    expect(quat.dot(a, mid)).toBeCloseTo(Math.cos((Math.PI - 0.25) / 2), 12);
  });

  test('angleBetweenDegrees is blind to the sign of either quaternion', () => {
    const a = fromAxisAngle([0, 0, 1], 0);
    const b = fromAxisAngle([0, 0, 1], (170 * Math.PI) / 180);
    // Rotation angle 2·acos|dot| (common practice); gl-matrix quat.getAngle gives the same for unit quats.
    expect(angleBetweenDegrees(a, b)).toBeCloseTo(170, 9);
    expect(angleBetweenDegrees(a, negate(b))).toBeCloseTo(170, 9);
    expect((quat.getAngle(a, b) * 180) / Math.PI).toBeCloseTo(170, 6);
  });

  test('rotateVector turns a vector as gl-matrix vec3.transformQuat does', () => {
    const q = normalize([0.3, -0.2, 0.5, 0.7]);
    // Oracle: gl-matrix vec3.transformQuat (q v q*).
    const expected = vec3.transformQuat(vec3.create(), [1, 2, 3], q);
    rotateVector(q, [1, 2, 3]).forEach((v, i) => expect(v).toBeCloseTo(expected[i], 12));
  });

  test('normalize scales to unit length and leaves a zero quaternion as the identity', () => {
    // Oracle: gl-matrix quat.length.
    expect(quat.length(normalize([1, 2, 3, 4]))).toBeCloseTo(1, 15);
    expect(normalize([0, 0, 0, 0])).toEqual([0, 0, 0, 1]);
  });
});

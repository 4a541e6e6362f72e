import { glMatrix, quat } from 'gl-matrix';
import { describe, expect, test } from 'vitest';
import { angleDegreesAt, sampleRotation, type AngleCurve } from './rotation-curve';

glMatrix.setMatrixArrayType(Array);

const CURVES: AngleCurve[] = [
  { axis: 'y', amplitudeDegrees: 30, frequencyHz: 0.5, phaseTurns: 0.1 },
  { axis: 'x', offsetDegrees: 20, amplitudeDegrees: 10, frequencyHz: 1 },
  { axis: 'z', turnsPerSecond: 0.25 }
];

describe('sampleRotation', () => {
  test('composes the curves outermost first, as gl-matrix multiplies axis rotations', () => {
    const timeSeconds = 0.37;
    const toRadians = (curve: AngleCurve) => (angleDegreesAt(curve, timeSeconds) * Math.PI) / 180;
    // Oracle: gl-matrix quat.setAxisAngle and quat.multiply (Hamilton product), R(c0)·R(c1)·R(c2).
    const expected = quat.create();
    for (const curve of CURVES) {
      const axis: [number, number, number] = [
        curve.axis === 'x' ? 1 : 0,
        curve.axis === 'y' ? 1 : 0,
        curve.axis === 'z' ? 1 : 0
      ];
      quat.multiply(expected, expected, quat.setAxisAngle(quat.create(), axis, toRadians(curve)));
    }
    sampleRotation(CURVES, timeSeconds).forEach((v, i) => expect(v).toBeCloseTo(expected[i], 12));
  });

  test('samples at 30 fps are unit and continuous (no consecutive dot below zero)', () => {
    const keys = Array.from({ length: 121 }, (_, k) => sampleRotation(CURVES, k / 30));
    // Oracle: gl-matrix quat.length and quat.dot.
    for (const key of keys) expect(Math.abs(quat.length(key) - 1)).toBeLessThan(1e-12);
    for (let k = 1; k < keys.length; k++) expect(quat.dot(keys[k - 1], keys[k])).toBeGreaterThan(0.99);
  });

  test('a full turn ends on the negated start: the same pose, reached continuously', () => {
    const spin: AngleCurve[] = [{ axis: 'y', turnsPerSecond: 1 }];
    // A 360° rotation is the quaternion -1 (glTF 2.0 §3.5.2 stores unit quaternions; q and -q are one pose).
    expect(quat.dot(sampleRotation(spin, 0), sampleRotation(spin, 1))).toBeCloseTo(-1, 12);
  });

  test('angle curves add offset, sine and steady spin', () => {
    const curve: AngleCurve = {
      axis: 'x',
      offsetDegrees: 10,
      amplitudeDegrees: 5,
      frequencyHz: 1,
      phaseTurns: 0.25,
      turnsPerSecond: 0.5
    };
    // sin(2π·0.25) = 1 at t = 0; a steady half turn per second adds 180° per second (arithmetic).
    expect(angleDegreesAt(curve, 0)).toBeCloseTo(15, 12);
    expect(angleDegreesAt(curve, 1)).toBeCloseTo(10 + 5 + 180, 9);
  });
});

import { quat } from 'gl-matrix';
import { describe, expect, it } from 'vitest';
import { angleDegrees, dot, keySeriesOf } from './channel-math';

const DEGREES = 180 / Math.PI;

function axisAngle(axis: [number, number, number], angleDegrees: number): [number, number, number, number] {
  const q = quat.create();
  quat.setAxisAngle(q, axis, angleDegrees / DEGREES);
  return [q[0], q[1], q[2], q[3]];
}

describe('angleDegrees', () => {
  it('measures the turn between two keys as gl-matrix quat.getAngle does', () => {
    const a = axisAngle([0, 1, 0], 10);
    const b = axisAngle([0, 1, 0], 55);
    // Oracle: gl-matrix quat.getAngle (angle of the relative rotation between two unit quaternions).
    const expected = quat.getAngle(quat.fromValues(...a), quat.fromValues(...b)) * DEGREES;
    expect(angleDegrees(a, b)).toBeCloseTo(expected, 4);
    expect(angleDegrees(a, b)).toBeCloseTo(45, 4);
  });

  it('takes the shorter arc when the second key is stored in the other hemisphere', () => {
    const a = axisAngle([1, 0, 0], 20);
    const b = axisAngle([1, 0, 0], 50).map((component) => -component);
    // q and -q are the same rotation (glTF 2.0 Appendix C slerp takes the shorter path): 30° apart, not 330°.
    expect(dot(a, b)).toBeLessThan(0);
    expect(angleDegrees(a, b)).toBeCloseTo(30, 4);
  });

  it('has no angle for a key of zero length', () => {
    expect(angleDegrees([0, 0, 0, 0], [0, 0, 0, 1])).toBeNull();
  });
});

describe('keySeriesOf', () => {
  it('gives per-key lengths and per-segment speeds in degrees per second', () => {
    const keys = [axisAngle([0, 0, 1], 0), axisAngle([0, 0, 1], 90), axisAngle([0, 0, 1], 90).map((c) => c * 1.02)];
    const series = keySeriesOf([0, 0.5, 1], keys.flat(), 3);
    // The keys come from gl-matrix in float32, so lengths hold to about 1e-7; scaling a unit quaternion by 1.02
    // scales its Euclidean length by 1.02 (common practice).
    expect(series.length).toEqual([expect.closeTo(1, 6), expect.closeTo(1, 6), expect.closeTo(1.02, 6)]);
    // 90° in 0.5 s is 180°/s; the last segment only rescales, so it turns by nothing (tolerance 1e-4°/s).
    expect(series.speedDegreesPerSecond[0]).toBeCloseTo(180, 4);
    expect(series.speedDegreesPerSecond[1]).toBeCloseTo(0, 4);
  });

  it('leaves the speed empty where key times do not advance', () => {
    const key = axisAngle([0, 1, 0], 30);
    const series = keySeriesOf([0.2, 0.2], [...key, ...key], 2);
    expect(series.speedDegreesPerSecond).toEqual([null]);
  });
});

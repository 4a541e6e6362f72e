import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { quat } from 'gl-matrix';
import { keyAngleRadians } from './key-angle';

const unitQuat = fc
  .tuple(
    fc.double({ min: -1, max: 1, noNaN: true }),
    fc.double({ min: -1, max: 1, noNaN: true }),
    fc.double({ min: -1, max: 1, noNaN: true }),
    fc.double({ min: -1, max: 1, noNaN: true })
  )
  .filter(([x, y, z, w]) => Math.hypot(x, y, z, w) > 0.1)
  .map(([x, y, z, w]) => {
    const length = Math.hypot(x, y, z, w);
    return [x / length, y / length, z / length, w / length] as [number, number, number, number];
  });

describe('keyAngleRadians', () => {
  it('matches gl-matrix quat.getAngle for unit quaternions', () => {
    fc.assert(
      fc.property(unitQuat, unitQuat, (a, b) => {
        // Oracle: gl-matrix quat.getAngle (acos(2·dot² − 1) = the rotation angle between unit quaternions).
        const expected = quat.getAngle(a, b);
        // getAngle's acos(2·dot² − 1) is NaN when rounding pushes its argument past 1.
        fc.pre(!Number.isNaN(expected));
        // acos near ±1 is ill-conditioned in either formula; compare with a tolerance scaled for it.
        expect(keyAngleRadians(a, 0, b, 0)).toBeCloseTo(expected, 3);
      })
    );
  });

  it('is the same for q and −q (one rotation, glTF 2.0 Appendix C short path)', () => {
    const a = [0, 0, Math.SQRT1_2, Math.SQRT1_2];
    const b = [0, 0, 0, 1];
    const negated = b.map((value) => -value);
    expect(keyAngleRadians(a, 0, b, 0)).toBeCloseTo(Math.PI / 2, 12);
    expect(keyAngleRadians(a, 0, negated, 0)).toBeCloseTo(Math.PI / 2, 12);
  });

  it('ignores length, so a drifted key measures like its unit direction', () => {
    const a = [0, 0, 0, 1.5];
    const b = [0, 0.9, 0, 0];
    expect(keyAngleRadians(a, 0, b, 0)).toBeCloseTo(Math.PI, 12);
  });

  it('is NaN for a zero or non-finite key', () => {
    expect(keyAngleRadians([0, 0, 0, 0], 0, [0, 0, 0, 1], 0)).toBeNaN();
    expect(keyAngleRadians([NaN, 0, 0, 1], 0, [0, 0, 0, 1], 0)).toBeNaN();
    expect(keyAngleRadians([Infinity, 0, 0, 1], 0, [0, 0, 0, 1], 0)).toBeNaN();
  });
});

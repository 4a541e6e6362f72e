import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { quat } from 'gl-matrix';
import { slerpInto } from './slerp';

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

describe('slerpInto', () => {
  it('matches gl-matrix quat.slerp, which also takes the short path', () => {
    fc.assert(
      fc.property(unitQuat, unitQuat, fc.double({ min: 0, max: 1, noNaN: true }), (a, b, t) => {
        const out = slerpInto(new Float64Array(4), a, 0, b, 0, t);
        // Oracle: gl-matrix quat.slerp (flips b when dot < 0, like glTF 2.0 Appendix C's sign s).
        const expected = quat.slerp(quat.create(), a, b, t);
        for (let c = 0; c < 4; c++) expect(out[c]).toBeCloseTo(expected[c], 5);
      })
    );
  });

  it('lands halfway in angle at t = ½ (glTF 2.0 Appendix C slerp)', () => {
    const half = Math.PI / 4; // a 90° turn about Z is a 45° 4D arc
    const out = slerpInto(new Float64Array(4), [0, 0, 0, 1], 0, [0, 0, Math.sin(half), Math.cos(half)], 0, 0.5);
    // Half of a 90° turn about Z is 45°: (0, 0, sin 22.5°, cos 22.5°).
    expect(out[2]).toBeCloseTo(Math.sin(Math.PI / 8), 12);
    expect(out[3]).toBeCloseTo(Math.cos(Math.PI / 8), 12);
  });

  it('returns the end keys at t = 0 and t = 1', () => {
    const a = [0.1, 0.2, 0.3, Math.sqrt(1 - 0.14)];
    const b = [0, Math.SQRT1_2, 0, Math.SQRT1_2];
    const start = slerpInto(new Float64Array(4), a, 0, b, 0, 0);
    const end = slerpInto(new Float64Array(4), a, 0, b, 0, 1);
    for (let c = 0; c < 4; c++) {
      expect(start[c]).toBeCloseTo(a[c], 12);
      expect(end[c]).toBeCloseTo(b[c], 12);
    }
  });
});

import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { quat } from 'gl-matrix';
import { multiplyQuat } from './quat-multiply';

const component = fc.double({ min: -2, max: 2, noNaN: true });

describe('multiplyQuat', () => {
  it('is the Hamilton product, as gl-matrix quat.multiply computes it', () => {
    fc.assert(
      fc.property(
        fc.tuple(component, component, component, component),
        fc.tuple(component, component, component, component),
        (a, b) => {
          const ours = multiplyQuat(new Float64Array(4), a[0], a[1], a[2], a[3], b[0], b[1], b[2], b[3]);
          // Oracle: gl-matrix quat.multiply(out, a, b) = a·b (Hamilton product).
          const oracle = quat.multiply(quat.create(), a, b);
          for (let c = 0; c < 4; c++) expect(ours[c]).toBeCloseTo(oracle[c], 4);
        }
      )
    );
  });

  it('turns i·j into k (Hamilton: ij = k)', () => {
    const out = multiplyQuat(new Float64Array(4), 1, 0, 0, 0, 0, 1, 0, 0);
    expect(Array.from(out)).toEqual([0, 0, 1, 0]);
  });
});

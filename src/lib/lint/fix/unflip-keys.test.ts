import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createKeyCurve } from './key-curve';
import { alignAntipodalKeys, unflipKeys } from './unflip-keys';

const dot = (values: ArrayLike<number>, a: number, b: number) =>
  values[a * 4] * values[b * 4] +
  values[a * 4 + 1] * values[b * 4 + 1] +
  values[a * 4 + 2] * values[b * 4 + 2] +
  values[a * 4 + 3] * values[b * 4 + 3];

const unitQuaternion = fc
  .tuple(
    fc.double({ min: -1, max: 1, noNaN: true }),
    fc.double({ min: -1, max: 1, noNaN: true }),
    fc.double({ min: -1, max: 1, noNaN: true }),
    fc.double({ min: -1, max: 1, noNaN: true })
  )
  .filter((q) => Math.hypot(...q) > 0.1)
  .map((q) => q.map((component) => component / Math.hypot(...q)));

describe('unflipKeys', () => {
  it('negates the key after a jump and every key after it', () => {
    // Keys about Y at 0°, 40°, then 80° and 120° written negated.
    const curve = createKeyCurve(4, [0, 0, 0, 1, 0, 0.342, 0, 0.94, 0, -0.643, 0, -0.766, 0, -0.866, 0, -0.5]);
    expect(unflipKeys(curve)).toBe(2);
    expect([...curve.changedKeys]).toEqual([0, 0, 1, 1]);
    expect([...curve.values.subarray(8)]).toEqual([0, 0.643, 0, 0.766, 0, 0.866, 0, 0.5]);
  });

  it('negates CUBICSPLINE tangents together with their key', () => {
    const curve = createKeyCurve(
      2,
      [0, 0, 0, 1, 0, 0, -0.1, -0.995],
      [0, 0, 0, 0, 0, 0, 0.2, 0.1],
      [0, 0, 0.3, 0, 0, 0, 0.2, 0.1]
    );
    unflipKeys(curve);
    expect([...curve.inTangents!.subarray(4)]).toEqual([0, 0, -0.2, -0.1]);
    expect([...curve.outTangents!.subarray(4)]).toEqual([0, 0, -0.2, -0.1]);
    expect([...curve.outTangents!.subarray(0, 4)]).toEqual([0, 0, 0.3, 0]);
  });

  it('leaves keys that already share a hemisphere alone, down to a dot product of exactly 0', () => {
    const curve = createKeyCurve(3, [0, 0, 0, 1, 1, 0, 0, 0, 0.6, 0, 0, 0.8]);
    expect(unflipKeys(curve)).toBe(0);
  });

  it('makes every consecutive dot product non-negative, keeps every pose, and is idempotent', () => {
    fc.assert(
      fc.property(fc.array(unitQuaternion, { minLength: 2, maxLength: 16 }), (keys) => {
        const curve = createKeyCurve(keys.length, keys.flat());
        unflipKeys(curve);
        for (let k = 0; k + 1 < keys.length; k++) expect(dot(curve.values, k, k + 1)).toBeGreaterThanOrEqual(0);
        keys.forEach((key, k) => {
          // Same pose: each key is exactly q or −q, the same rotation (q·v·q* = (−q)·v·(−q)*).
          const after = [...curve.values.subarray(k * 4, k * 4 + 4)].map((component) => component + 0);
          const sign = Math.sign(after[0] * key[0] + after[1] * key[1] + after[2] * key[2] + after[3] * key[3]) || 1;
          expect(after).toEqual(key.map((component) => sign * component + 0));
        });
        const once = [...curve.values];
        expect(unflipKeys(curve)).toBe(0);
        expect([...curve.values]).toEqual(once);
      })
    );
  });
});

describe('alignAntipodalKeys', () => {
  it('turns an antipodal pair into two equal keys and carries the sign through the tail', () => {
    const curve = createKeyCurve(3, [0, 0.6, 0, 0.8, 0, -0.6, 0, -0.8, 0.1, -0.6, 0, -0.79]);
    expect(alignAntipodalKeys(curve, 1e-3)).toBe(2);
    expect([...curve.values.subarray(4, 8)]).toEqual([0, 0.6, 0, 0.8]);
    expect(dot(curve.values, 1, 2)).toBeGreaterThan(0.99);
  });

  it('leaves a negative dot product that is not antipodal to unflipKeys', () => {
    const curve = createKeyCurve(2, [0, 0, 0, 1, 0, -0.2, 0, -0.98]);
    expect(alignAntipodalKeys(curve, 1e-3)).toBe(0);
  });

  it('counts a pair exactly at the tolerance distance as antipodal and one just past it as not', () => {
    // |q1 + q0| = 0.1 exactly: q0 = (0, 0, 0, 1), q1 = (0, 0, 0, -0.9) (lengths may drift; the rule measures raw).
    const at = createKeyCurve(2, [0, 0, 0, 1, 0, 0, 0, -0.9]);
    expect(alignAntipodalKeys(at, 0.1 + 1e-12)).toBe(1);
    const past = createKeyCurve(2, [0, 0, 0, 1, 0, 0, 0, -0.9]);
    expect(alignAntipodalKeys(past, 0.0999)).toBe(0);
  });
});

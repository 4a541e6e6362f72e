import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createKeyCurve } from './key-curve';
import { renormalizeKeys } from './renormalize-keys';

const OPTIONS = { unitTolerance: 1e-3, zeroLength: 1e-6 };

/** glTF 2.0 Appendix C cubic spline between keys k and k+1, normalized as the spec requires for rotations. */
function sampleCubic(
  values: ArrayLike<number>,
  inTangents: ArrayLike<number>,
  outTangents: ArrayLike<number>,
  k: number,
  duration: number,
  t: number
): number[] {
  const t2 = t * t;
  const t3 = t2 * t;
  const p = [0, 1, 2, 3].map(
    (c) =>
      (2 * t3 - 3 * t2 + 1) * values[k * 4 + c] +
      duration * (t3 - 2 * t2 + t) * outTangents[k * 4 + c] +
      (-2 * t3 + 3 * t2) * values[(k + 1) * 4 + c] +
      duration * (t3 - t2) * inTangents[(k + 1) * 4 + c]
  );
  const length = Math.hypot(...p);
  return p.map((component) => component / length);
}

describe('renormalizeKeys', () => {
  it('divides a drifting key by its length and leaves keys within tolerance bit-for-bit alone', () => {
    const values = [0, 0, 0, 1.05, 0, 0.6, 0, 0.8, 0, 0, 0, 1.0005];
    const curve = createKeyCurve(3, values);
    expect(renormalizeKeys(curve, OPTIONS)).toBe(1);
    expect([...curve.values.subarray(0, 4)]).toEqual([0, 0, 0, 1]);
    expect([...curve.values.subarray(4)]).toEqual(values.slice(4)); // 0.6² + 0.8² = 1 and 1.0005 is within 1e-3
    expect([...curve.changedKeys]).toEqual([1, 0, 0]);
  });

  it('treats the tolerance as inclusive: exactly 1 + tolerance stays', () => {
    const curve = createKeyCurve(1, [0, 0, 0, 1.5]);
    expect(renormalizeKeys(curve, { unitTolerance: 0.5, zeroLength: 1e-6 })).toBe(0);
    expect(renormalizeKeys(curve, { unitTolerance: 0.49, zeroLength: 1e-6 })).toBe(1);
  });

  it('skips keys that are no rotation at all (zero length, NaN)', () => {
    const curve = createKeyCurve(2, [0, 0, 0, 0, Number.NaN, 0, 0, 1]);
    expect(renormalizeKeys(curve, OPTIONS)).toBe(0);
  });

  it('scales CUBICSPLINE tangents with their key, so the normalized curve leaves the key the same way', () => {
    // Key 0 is 10% long; the curve towards key 1 is sampled just after key 0 (glTF 2.0 Appendix C).
    const s = Math.SQRT1_2;
    const values = [0, 0, 0, 1.1, 0, s, 0, s];
    const inTangents = [0, 0, 0, 0, 0, 0.4, 0, -0.4];
    const outTangents = [0.3, 0.5, 0, 0, 0, 0, 0, 0];
    const before = sampleCubic(values, inTangents, outTangents, 0, 1, 1e-4);
    const curve = createKeyCurve(2, values, inTangents, outTangents);
    renormalizeKeys(curve, OPTIONS);
    expect([...curve.outTangents!.subarray(0, 4)].map((v) => v * 1.1)).toEqual(
      outTangents.slice(0, 4).map((v) => expect.closeTo(v, 12))
    );
    const after = sampleCubic(curve.values, curve.inTangents!, curve.outTangents!, 0, 1, 1e-4);
    // Same direction up to second order in t (1e-8); unscaled tangents would differ to first order (~1e-5).
    after.forEach((component, index) => expect(component).toBeCloseTo(before[index], 7));
    const unscaled = sampleCubic(curve.values, inTangents, outTangents, 0, 1, 1e-4);
    expect(Math.abs(unscaled[0] - before[0])).toBeGreaterThan(1e-6);
  });

  it('leaves every key unit length (within float rounding) and is idempotent', () => {
    const quaternion = fc.tuple(
      fc.double({ min: -1, max: 1, noNaN: true }),
      fc.double({ min: -1, max: 1, noNaN: true }),
      fc.double({ min: -1, max: 1, noNaN: true }),
      fc.double({ min: -1, max: 1, noNaN: true })
    );
    fc.assert(
      fc.property(fc.array(quaternion, { minLength: 1, maxLength: 12 }), (keys) => {
        const curve = createKeyCurve(keys.length, keys.flat());
        renormalizeKeys(curve, OPTIONS);
        for (let k = 0; k < keys.length; k++) {
          const length = Math.hypot(...curve.values.subarray(k * 4, k * 4 + 4));
          if (length >= OPTIONS.zeroLength) expect(Math.abs(length - 1)).toBeLessThanOrEqual(OPTIONS.unitTolerance);
        }
        const once = [...curve.values];
        expect(renormalizeKeys(curve, OPTIONS)).toBe(0);
        expect([...curve.values]).toEqual(once);
      })
    );
  });
});

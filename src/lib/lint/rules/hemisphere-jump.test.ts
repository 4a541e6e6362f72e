import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { quat } from 'gl-matrix';
import { hemisphereJump } from './hemisphere-jump';
import { channelFrom, runOnChannels, steadyTurn } from './testing';

function negate(q: readonly number[]): number[] {
  return q.map((component) => -component);
}

describe('hemisphere-jump', () => {
  it('warns on a LINEAR channel where one key is written as −q', () => {
    const quats: number[][] = steadyTurn([0, 0, 1], 5, 8);
    quats[3] = negate(quats[3]);
    const findings = runOnChannels(hemisphereJump, [channelFrom({ interpolation: 'LINEAR', quats })]);
    expect(findings).toHaveLength(1);
    expect(findings[0]).toMatchObject({ severity: 'warning', keys: [2, 4], values: { flips: 2 } });
    // Oracle: gl-matrix quat.dot of the normalized keys (glTF 2.0 Appendix C's v_k·v_k+1).
    expect(findings[0].values.dot).toBeCloseTo(quat.dot(quats[2] as quat, quats[3] as quat), 6);
  });

  it('errs on a CUBICSPLINE channel, whose formula has no sign correction (Appendix C)', () => {
    const quats: number[][] = steadyTurn([0, 0, 1], 5, 4);
    quats[2] = negate(quats[2]);
    expect(runOnChannels(hemisphereJump, [channelFrom({ interpolation: 'CUBICSPLINE', quats })])[0].severity).toBe(
      'error'
    );
  });

  it('ignores STEP channels, which never interpolate', () => {
    const quats: number[][] = steadyTurn([0, 0, 1], 5, 4);
    quats[2] = negate(quats[2]);
    expect(runOnChannels(hemisphereJump, [channelFrom({ interpolation: 'STEP', quats })])).toEqual([]);
  });

  it('does not flag keys exactly 180° apart (dot 0) and flags the first step past it (threshold)', () => {
    const orthogonal = [
      [0, 0, 0, 1],
      [0, 0, 1, 0]
    ];
    expect(runOnChannels(hemisphereJump, [channelFrom({ interpolation: 'LINEAR', quats: orthogonal })])).toEqual([]);
    const past = [
      [0, 0, 0, 1],
      [0, 0, 1, -0.001]
    ];
    expect(runOnChannels(hemisphereJump, [channelFrom({ interpolation: 'LINEAR', quats: past })])).toHaveLength(1);
  });

  it('finds random sign flips exactly where they were inserted', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 3, max: 60 }),
        fc.array(fc.boolean(), { minLength: 60, maxLength: 60 }),
        (count, flips) => {
          // A steady 3° turn keeps every consecutive dot positive before the flips.
          const quats = steadyTurn([0.3, 0.8, -0.5], 3, count).map((q, k) => (flips[k] ? negate(q) : q));
          const findings = runOnChannels(hemisphereJump, [channelFrom({ interpolation: 'LINEAR', quats })]);
          const flagged = new Set<number>();
          for (const finding of findings) for (let k = finding.keys![0]; k < finding.keys![1]; k++) flagged.add(k);
          const expected = new Set<number>();
          for (let k = 0; k + 1 < count; k++) if (flips[k] !== flips[k + 1]) expected.add(k);
          expect([...flagged].sort((a, b) => a - b)).toEqual([...expected].sort((a, b) => a - b));
        }
      )
    );
  });
});

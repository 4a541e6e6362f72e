import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { glMatrix, quat } from 'gl-matrix';
import { redundantKeys } from './redundant-keys';
import { axisAngle, channelFrom, runOnChannels, steadyTurn } from './testing';

// Double precision for the oracle: in float32, acos near 1 is off by hundredths of a degree.
glMatrix.setMatrixArrayType(Float64Array as unknown as ArrayConstructor);

/**
 * The oracle: an interior key is redundant when gl-matrix quat.slerp of its neighbours at its
 * time lands within the tolerance (rotation angle) — glTF 2.0 Appendix C slerp.
 */
function oracleRedundant(quats: number[][], times: number[], toleranceDegrees: number): boolean[] {
  const unit = quats.map((q) => quat.normalize(quat.create(), q as quat));
  return quats.map((_, k) => {
    if (k === 0 || k === quats.length - 1) return false;
    const u = (times[k] - times[k - 1]) / (times[k + 1] - times[k - 1]);
    const between = quat.slerp(quat.create(), unit[k - 1], unit[k + 1], u);
    // quat.getAngle's acos(2d² − 1) turns NaN when rounding pushes 2d² − 1 past 1, so the rotation
    // angle comes from quat.dot directly: 2·acos(|dot|).
    const angle = 2 * Math.acos(Math.min(1, Math.abs(quat.dot(between, unit[k]))));
    return (angle * 180) / Math.PI <= toleranceDegrees;
  });
}

function runsOf(flags: boolean[], minimum: number): [number, number][] {
  const runs: [number, number][] = [];
  let start = -1;
  flags.forEach((flag, k) => {
    if (flag && start < 0) start = k;
    if ((!flag || k === flags.length - 1) && start >= 0) {
      const end = flag ? k : k - 1;
      if (end - start + 1 >= minimum) runs.push([start, end]);
      start = -1;
    }
  });
  return runs;
}

describe('redundant-keys', () => {
  it('reports the interior keys of a steady LINEAR turn with the bytes they cost', () => {
    const quats = steadyTurn([0, 1, 0], 2, 30);
    const findings = runOnChannels(redundantKeys, [channelFrom({ interpolation: 'LINEAR', quats })]);
    expect(findings).toHaveLength(1);
    // 28 interior keys in one run; every other key keeps both neighbours: 14 removable, each
    // 4 bytes of time + 16 bytes of float VEC4 value.
    expect(findings[0]).toMatchObject({
      severity: 'info',
      keys: [1, 28],
      values: { redundantKeys: 28, runs: 1, removableKeys: 14, bytesSaved: 280 }
    });
  });

  it('reports a held STEP pose and a CUBICSPLINE curve that is one cubic', () => {
    const held = Array.from({ length: 8 }, () => axisAngle([1, 0, 0], 20));
    expect(runOnChannels(redundantKeys, [channelFrom({ interpolation: 'STEP', quats: held })])[0].values).toMatchObject(
      { redundantKeys: 6 }
    );
    // Keys and tangents sampled from one cubic in time (each component t³/2): merging segments changes nothing.
    const times = [0, 0.25, 0.5, 0.75, 1, 1.25, 1.5];
    const cubic = (t: number) => [0.1 * t * t * t, 0.05 * t * t, 0.02 * t, 1];
    const slope = (t: number) => [0.3 * t * t, 0.1 * t, 0.02, 0];
    const channel = channelFrom({
      interpolation: 'CUBICSPLINE',
      times,
      quats: times.map(cubic),
      inTangents: times.map(slope),
      outTangents: times.map(slope)
    });
    expect(runOnChannels(redundantKeys, [channel])[0].values).toMatchObject({ redundantKeys: 5, runs: 1 });
  });

  it('ignores runs shorter than four keys and wobbling motion', () => {
    const short = [...steadyTurn([0, 1, 0], 2, 5), axisAngle([1, 0, 0], 30), axisAngle([0, 0, 1], 50)];
    expect(runOnChannels(redundantKeys, [channelFrom({ interpolation: 'LINEAR', quats: short })])).toEqual([]);
    const wobble = Array.from({ length: 20 }, (_, k) => axisAngle([0, 1, 0], 10 * Math.sin(k)));
    expect(runOnChannels(redundantKeys, [channelFrom({ interpolation: 'LINEAR', quats: wobble })])).toEqual([]);
  });

  it('draws the line at tolerances.redundantDegrees (threshold at 0.01°)', () => {
    // Nudging every other key off the steady turn by 0.009° keeps them redundant; 0.011° does not.
    const nudged = (degrees: number) =>
      steadyTurn([0, 1, 0], 2, 12).map((q, k) =>
        k % 2 === 1 ? Array.from(quat.multiply(quat.create(), axisAngle([1, 0, 0], degrees), q)) : q
      );
    const inside = runOnChannels(redundantKeys, [channelFrom({ interpolation: 'LINEAR', quats: nudged(0.009) })]);
    expect(inside[0]?.values.redundantKeys).toBe(10);
    expect(runOnChannels(redundantKeys, [channelFrom({ interpolation: 'LINEAR', quats: nudged(0.011) })])).toEqual([]);
  });

  it('agrees with a slerp oracle on channels that mix steady stretches and jitter', () => {
    fc.assert(
      fc.property(
        fc.array(
          fc.record({
            steady: fc.boolean(),
            length: fc.integer({ min: 1, max: 9 }),
            step: fc.double({ min: 0.5, max: 6, noNaN: true })
          }),
          { minLength: 1, maxLength: 8 }
        ),
        fc.integer({ min: 0, max: 1000 }),
        (pieces, seed) => {
          const quats: number[][] = [];
          let angle = 0;
          let jitter = seed;
          for (const piece of pieces) {
            for (let i = 0; i < piece.length; i++) {
              // Jittered keys move by an irregular step, at least 0.5° off the steady slerp.
              jitter = (jitter * 9301 + 49297) % 233280;
              angle += piece.steady ? piece.step : piece.step + 1 + (jitter / 233280) * 3;
              quats.push(axisAngle([0.2, 1, 0.1], angle));
            }
          }
          const times = quats.map((_, k) => k / 30);
          const expectedRuns = runsOf(oracleRedundant(quats, times, 0.01), 4);
          const findings = runOnChannels(redundantKeys, [channelFrom({ interpolation: 'LINEAR', quats, times })]);
          const keys = expectedRuns.reduce((sum, [first, last]) => sum + last - first + 1, 0);
          if (expectedRuns.length === 0) expect(findings).toEqual([]);
          else expect(findings[0].values).toMatchObject({ runs: expectedRuns.length, redundantKeys: keys });
        }
      )
    );
  });
});

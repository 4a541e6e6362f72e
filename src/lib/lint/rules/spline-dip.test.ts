import { describe, expect, it } from 'vitest';
import { splineDip } from './spline-dip';
import { axisAngle, channelFrom, runOnChannels } from './testing';

/** |p(t)| of the glTF 2.0 Appendix C cubic at t, component by component (the oracle). */
function appendixCLength(v0: number[], b0: number[], v1: number[], a1: number[], td: number, t: number): number {
  let sum = 0;
  for (let c = 0; c < 4; c++) {
    const p =
      (2 * t ** 3 - 3 * t ** 2 + 1) * v0[c] +
      td * (t ** 3 - 2 * t ** 2 + t) * b0[c] +
      (-2 * t ** 3 + 3 * t ** 2) * v1[c] +
      td * (t ** 3 - t ** 2) * a1[c];
    sum += p * p;
  }
  return Math.sqrt(sum);
}

const zero = [0, 0, 0, 0];

describe('spline-dip', () => {
  it('reports a cubic segment whose chord cuts deep inside the unit sphere (120° step, zero tangents)', () => {
    const v0 = axisAngle([0, 0, 1], 0);
    const v1 = axisAngle([0, 0, 1], 120);
    const findings = runOnChannels(splineDip, [
      channelFrom({ interpolation: 'CUBICSPLINE', quats: [v0, v1], times: [0, 1] })
    ]);
    expect(findings).toHaveLength(1);
    // The curve is sampled at t = k/8; its shortest sample is at t = ½: cos(30°) = 0.866.
    expect(findings[0].values.minLength as number).toBeCloseTo(appendixCLength(v0, zero, v1, zero, 1, 0.5), 6);
    expect(findings[0].values.atTimeSeconds).toBeCloseTo(0.5, 9);
  });

  it('reports tangents that pull the curve inward', () => {
    const v0 = axisAngle([0, 0, 1], 0);
    const v1 = axisAngle([0, 0, 1], 10);
    // Out-tangent pointing away from the next key (towards −v0), at 2 units per second over 1 s.
    const outTangents = [v0.map((c) => -2 * c), zero];
    const findings = runOnChannels(splineDip, [
      channelFrom({ interpolation: 'CUBICSPLINE', quats: [v0, v1], outTangents, times: [0, 1] })
    ]);
    expect(findings).toHaveLength(1);
    expect(findings[0].values.minLength as number).toBeLessThan(appendixCLength(v0, zero, v1, zero, 1, 0.5));
  });

  it('stays quiet for a dense smooth curve and for LINEAR channels', () => {
    const quats = Array.from({ length: 20 }, (_, k) => axisAngle([0, 1, 0], k * 3));
    expect(runOnChannels(splineDip, [channelFrom({ interpolation: 'CUBICSPLINE', quats })])).toEqual([]);
    const wide = [axisAngle([0, 0, 1], 0), axisAngle([0, 0, 1], 120)];
    expect(runOnChannels(splineDip, [channelFrom({ interpolation: 'LINEAR', quats: wide })])).toEqual([]);
  });

  it('compares the sag with splineMinLength (threshold)', () => {
    // A 120° step sags to cos 30° = 0.8660 at the midpoint.
    const quats = [axisAngle([0, 0, 1], 0), axisAngle([0, 0, 1], 120)];
    const channel = () => channelFrom({ interpolation: 'CUBICSPLINE', quats, times: [0, 1] });
    expect(runOnChannels(splineDip, [channel()], { splineMinLength: 0.865 })).toEqual([]);
    expect(runOnChannels(splineDip, [channel()], { splineMinLength: 0.867 })).toHaveLength(1);
  });
});

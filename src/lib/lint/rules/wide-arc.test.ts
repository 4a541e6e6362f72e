import { describe, expect, it } from 'vitest';
import { quat } from 'gl-matrix';
import { wideArc } from './wide-arc';
import { axisAngle, channelFrom, runOnChannels } from './testing';

const start = axisAngle([0, 0, 1], 0);

describe('wide-arc', () => {
  it('reports a 160° step between consecutive keys with its angle', () => {
    const end = axisAngle([0, 0, 1], 160);
    const findings = runOnChannels(wideArc, [
      channelFrom({ interpolation: 'LINEAR', quats: [start, end], times: [0, 0.5] })
    ]);
    expect(findings).toHaveLength(1);
    // Oracle: gl-matrix quat.getAngle, the rotation between two unit quaternions.
    expect(findings[0].values.angleDegrees as number).toBeCloseTo((quat.getAngle(start, end) * 180) / Math.PI, 4);
    expect(findings[0]).toMatchObject({ severity: 'warning', keys: [0, 1] });
  });

  it('measures the short way, so a 200° step written without a flip is a 160° arc', () => {
    const findings = runOnChannels(wideArc, [
      channelFrom({ interpolation: 'LINEAR', quats: [start, axisAngle([0, 0, 1], 200)] })
    ]);
    expect(findings[0].values.angleDegrees as number).toBeCloseTo(160, 4);
  });

  it('stays quiet at 149.9° and speaks at 150.1° with the default 150° limit (threshold)', () => {
    expect(
      runOnChannels(wideArc, [channelFrom({ interpolation: 'LINEAR', quats: [start, axisAngle([1, 0, 0], 149.9)] })])
    ).toEqual([]);
    expect(
      runOnChannels(wideArc, [channelFrom({ interpolation: 'LINEAR', quats: [start, axisAngle([1, 0, 0], 150.1)] })])
    ).toHaveLength(1);
  });

  it('ignores STEP channels', () => {
    expect(
      runOnChannels(wideArc, [channelFrom({ interpolation: 'STEP', quats: [start, axisAngle([0, 0, 1], 170)] })])
    ).toEqual([]);
  });
});

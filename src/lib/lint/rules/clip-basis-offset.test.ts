import { describe, expect, it } from 'vitest';
import { Quaternion } from 'three';
import { clipBasisOffset } from './clip-basis-offset';
import { axisAngle, channelFrom, runRule } from './testing';

/** Hamilton product a·b through three.js Quaternion.multiplyQuaternions (the oracle). */
function times(a: number[], b: number[]): number[] {
  const q = new Quaternion().multiplyQuaternions(new Quaternion(...a), new Quaternion(...b));
  return [q.x, q.y, q.z, q.w];
}

const turn = axisAngle([1, 0, 0], -90);
const rest = axisAngle([0, 1, 0], 30);

function swaying(degrees: number): number[][] {
  // A root sway of ±degrees about Z around the rest pose, with the Z-up correction applied above it.
  return [-1, -0.5, 0, 0.5, 1].map((f) => times(times(turn, axisAngle([0, 0, 1], f * degrees)), rest));
}

describe('clip-basis-offset', () => {
  it('reports a root clip whose every key is the rest rotation turned −90° about X', () => {
    const channel = channelFrom({
      interpolation: 'LINEAR',
      quats: swaying(10),
      restRotation: rest,
      isRoot: true
    });
    const findings = runRule(clipBasisOffset, { channels: [channel] });
    expect(findings).toHaveLength(1);
    expect(findings[0]).toMatchObject({
      severity: 'warning',
      keys: [0, 4],
      values: { axis: 'X', angleDegrees: -90, side: 'parent' }
    });
    expect(findings[0].values.worstDeviationDegrees as number).toBeCloseTo(10, 3);
  });

  it('finds the offset on the local side too (key = rest·turn)', () => {
    const quats = [0, 1, 2].map(() => times(rest, turn));
    const findings = runRule(clipBasisOffset, {
      channels: [channelFrom({ interpolation: 'LINEAR', quats, restRotation: rest, isRoot: true })]
    });
    expect(findings[0].values.side).toBe('local');
  });

  it('stays quiet for clips around the rest pose, non-root channels and clips that leave the offset', () => {
    const aroundRest = [-5, 0, 5].map((degrees) => times(axisAngle([0, 0, 1], degrees), rest));
    expect(
      runRule(clipBasisOffset, {
        channels: [channelFrom({ interpolation: 'LINEAR', quats: aroundRest, restRotation: rest, isRoot: true })]
      })
    ).toEqual([]);
    expect(
      runRule(clipBasisOffset, {
        channels: [channelFrom({ interpolation: 'LINEAR', quats: swaying(10), restRotation: rest, isRoot: false })]
      })
    ).toEqual([]);
    const turning = [...swaying(10), rest];
    expect(
      runRule(clipBasisOffset, {
        channels: [channelFrom({ interpolation: 'LINEAR', quats: turning, restRotation: rest, isRoot: true })]
      })
    ).toEqual([]);
  });

  it('allows sway up to convention.clipOffsetToleranceDegrees (threshold at 20°)', () => {
    const within = channelFrom({
      interpolation: 'LINEAR',
      quats: swaying(19.5),
      restRotation: rest,
      isRoot: true
    });
    const beyond = channelFrom({
      interpolation: 'LINEAR',
      quats: swaying(20.5),
      restRotation: rest,
      isRoot: true
    });
    expect(runRule(clipBasisOffset, { channels: [within] })).toHaveLength(1);
    expect(runRule(clipBasisOffset, { channels: [beyond] })).toEqual([]);
  });
});

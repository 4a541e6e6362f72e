import { describe, expect, it } from 'vitest';
import { Euler, Quaternion } from 'three';
import type { EulerOrder } from '../policy';
import { gimbalProximity } from './gimbal-proximity';
import { channelFrom, runOnChannels } from './testing';

/** A quaternion from Euler angles in degrees through three.js (the oracle for order conventions). */
function fromEuler(x: number, y: number, z: number, order: EulerOrder): number[] {
  const r = Math.PI / 180;
  const q = new Quaternion().setFromEuler(new Euler(x * r, y * r, z * r, order));
  return [q.x, q.y, q.z, q.w];
}

const euler = (order: EulerOrder) => ({
  engine: { rotationStorage: 'euler' as const, eulerOrder: order, gimbalMarginDegrees: 5 }
});

describe('gimbal-proximity', () => {
  it('reports keys whose XYZ middle (Y) angle is within 5° of 90°', () => {
    const quats = [
      fromEuler(10, 20, 30, 'XYZ'),
      fromEuler(10, 88, 30, 'XYZ'),
      fromEuler(10, 87, 30, 'XYZ'),
      fromEuler(10, 20, 30, 'XYZ')
    ];
    const findings = runOnChannels(gimbalProximity, [channelFrom({ interpolation: 'LINEAR', quats })], euler('XYZ'));
    expect(findings).toHaveLength(1);
    expect(findings[0]).toMatchObject({ keys: [1, 2], severity: 'warning', values: { order: 'XYZ', worstKey: 1 } });
    expect(findings[0].values.middleAngleDegrees as number).toBeCloseTo(88, 4);
  });

  it('uses the middle axis of the configured order (ZXY locks on X)', () => {
    const quats = [fromEuler(-86, 40, 10, 'ZXY')];
    expect(
      runOnChannels(gimbalProximity, [channelFrom({ interpolation: 'LINEAR', quats })], euler('ZXY'))
    ).toHaveLength(1);
    expect(runOnChannels(gimbalProximity, [channelFrom({ interpolation: 'LINEAR', quats })], euler('XYZ'))).toEqual([]);
  });

  it('does nothing when the engine stores quaternions (the default)', () => {
    const quats = [fromEuler(0, 90, 0, 'XYZ')];
    expect(runOnChannels(gimbalProximity, [channelFrom({ interpolation: 'LINEAR', quats })])).toEqual([]);
  });

  it('honours the margin: 84.9° is clear of a 5° margin, 85.1° is not (threshold)', () => {
    const clear = [fromEuler(0, 84.9, 0, 'XYZ')];
    const close = [fromEuler(0, 85.1, 0, 'XYZ')];
    expect(
      runOnChannels(gimbalProximity, [channelFrom({ interpolation: 'LINEAR', quats: clear })], euler('XYZ'))
    ).toEqual([]);
    expect(
      runOnChannels(gimbalProximity, [channelFrom({ interpolation: 'LINEAR', quats: close })], euler('XYZ'))
    ).toHaveLength(1);
  });
});

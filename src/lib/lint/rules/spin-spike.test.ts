import { describe, expect, it } from 'vitest';
import { spinSpike } from './spin-spike';
import { axisAngle, channelFrom, runOnChannels, steadyTurn } from './testing';

/** A slow 1° per key turn at 30 keys per second (30°/s) with one key jumped by `spikeDegrees`. */
function spiked(spikeDegrees: number, count = 30, at = 15) {
  const quats = steadyTurn([0, 1, 0], 1, count);
  quats[at] = axisAngle([0, 1, 0], at + spikeDegrees);
  return quats;
}

describe('spin-spike', () => {
  it('reports the one-frame whip of an Euler bake through gimbal lock', () => {
    const findings = runOnChannels(spinSpike, [channelFrom({ interpolation: 'LINEAR', quats: spiked(120) })]);
    expect(findings).toHaveLength(1);
    expect(findings[0]).toMatchObject({ severity: 'warning', keys: [14, 16] });
    // 121° in 1/30 s (glTF 2.0 Appendix C slerp angle over the key interval) is 3630°/s.
    expect(findings[0].values.speedDegreesPerSecond as number).toBeCloseTo(121 * 30, 0);
    expect(findings[0].values.medianBelowDegreesPerSecond as number).toBeGreaterThan(30);
  });

  it('stays quiet on a clip that is fast throughout (median speed just as high)', () => {
    const quats = steadyTurn([0, 1, 0], 60, 30);
    expect(runOnChannels(spinSpike, [channelFrom({ interpolation: 'LINEAR', quats })])).toEqual([]);
  });

  it('needs the absolute limit too: 1400°/s stays quiet, 1500°/s is reported (threshold at 1440°/s)', () => {
    // 46.67° in 1/30 s is 1400°/s; 50° is 1500°/s; both far above 8× the 30°/s median.
    expect(runOnChannels(spinSpike, [channelFrom({ interpolation: 'LINEAR', quats: spiked(45.67) })])).toEqual([]);
    expect(runOnChannels(spinSpike, [channelFrom({ interpolation: 'LINEAR', quats: spiked(49) })])).toHaveLength(1);
  });

  it('computes the exact median when counting cannot decide, and reports it', () => {
    // Five steps of 0.5° (15°/s), five of 14° (420°/s), then one big step: 11 steps, median 420°/s.
    // A 100° step (3000°/s) is under 8 × 420 = 3360°/s, so not a spike; a 120° step (3600°/s) is.
    // The cheap bound puts a 14° step at most π·√(1 − cos 7°)·30 = 466°/s, above 3000/8 and 3600/8,
    // so counting alone cannot settle the median and the rule computes it.
    const angles = [0, 0.5, 1, 1.5, 2, 2.5, 16.5, 30.5, 44.5, 58.5, 72.5];
    const base = angles.map((angle) => axisAngle([1, 0, 0], angle));
    const slowSpike = [...base, axisAngle([1, 0, 0], 72.5 + 100)];
    expect(runOnChannels(spinSpike, [channelFrom({ interpolation: 'LINEAR', quats: slowSpike })])).toEqual([]);
    const fastSpike = [...base, axisAngle([1, 0, 0], 72.5 + 120)];
    const findings = runOnChannels(spinSpike, [channelFrom({ interpolation: 'LINEAR', quats: fastSpike })]);
    expect(findings).toHaveLength(1);
    expect(findings[0].values.medianDegreesPerSecond as number).toBeCloseTo(420, 1);
  });

  it('ignores STEP channels', () => {
    expect(runOnChannels(spinSpike, [channelFrom({ interpolation: 'STEP', quats: spiked(120) })])).toEqual([]);
  });
});

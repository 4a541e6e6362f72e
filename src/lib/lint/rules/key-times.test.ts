import { describe, expect, it } from 'vitest';
import { keyTimes } from './key-times';
import { channelFrom, runOnChannels, steadyTurn } from './testing';

const quats = steadyTurn([0, 1, 0], 2, 6);

describe('key-times', () => {
  it('reports a key whose time repeats the one before (glTF 2.0 animation.sampler: strictly increasing)', () => {
    const findings = runOnChannels(keyTimes, [
      channelFrom({ interpolation: 'LINEAR', quats, times: [0, 0.1, 0.2, 0.2, 0.4, 0.5] })
    ]);
    expect(findings).toHaveLength(1);
    expect(findings[0]).toMatchObject({ rule: 'key-times', severity: 'error', keys: [2, 3] });
    expect(findings[0].message).toContain('0.2 s to 0.2 s');
  });

  it('reports times that run backwards, negative times and NaN times separately', () => {
    const findings = runOnChannels(keyTimes, [
      channelFrom({ interpolation: 'LINEAR', quats, times: [-0.5, 0.1, NaN, 0.3, 0.25, 0.5] })
    ]);
    expect(findings.map((finding) => finding.keys)).toEqual([
      [2, 2],
      [0, 0],
      [3, 4]
    ]);
    expect(findings.every((finding) => finding.severity === 'error')).toBe(true);
  });

  it('accepts strictly increasing times from zero, even a microsecond apart (threshold)', () => {
    const findings = runOnChannels(keyTimes, [
      channelFrom({ interpolation: 'LINEAR', quats, times: [0, 1e-6, 2e-6, 1, 2, 3] })
    ]);
    expect(findings).toEqual([]);
  });

  it('reports an output with a value count that does not match the key times', () => {
    const channel = channelFrom({ interpolation: 'LINEAR', quats, raw: { outputCount: 5 } });
    const findings = runOnChannels(keyTimes, [channel]);
    expect(findings).toHaveLength(1);
    expect(findings[0]).toMatchObject({
      keys: null,
      values: { inputCount: 6, outputCount: 5, expectedOutputCount: 6 }
    });
  });

  it('expects three output values per key on CUBICSPLINE (in-tangent, value, out-tangent; Appendix C)', () => {
    const good = channelFrom({ interpolation: 'CUBICSPLINE', quats });
    expect(runOnChannels(keyTimes, [good])).toEqual([]);
    const bad = channelFrom({ interpolation: 'CUBICSPLINE', quats, raw: { outputCount: 6 } });
    expect(runOnChannels(keyTimes, [bad])[0].values).toMatchObject({ expectedOutputCount: 18 });
  });

  it('reports a CUBICSPLINE sampler with a single key (Appendix C: at least two keyframes)', () => {
    const findings = runOnChannels(keyTimes, [
      channelFrom({ interpolation: 'CUBICSPLINE', quats: [[0, 0, 0, 1]], times: [0] })
    ]);
    expect(findings).toHaveLength(1);
    expect(findings[0].message).toContain('at least two keys');
  });
});

import { describe, expect, it } from 'vitest';
import { notARotation } from './not-a-rotation';
import { channelFrom, factsFrom, nodeFrom, runRule, steadyTurn } from './testing';

describe('not-a-rotation', () => {
  it('reports NaN, infinite and zero keys as one run, worst kind first', () => {
    const quats = steadyTurn([1, 0, 0], 1, 8);
    quats[3] = [0, 0, 0, 0];
    quats[4] = [NaN, 0, 0, 1];
    quats[5] = [Infinity, 0, 0, 1];
    const findings = runRule(notARotation, { channels: [channelFrom({ interpolation: 'LINEAR', quats })] });
    expect(findings).toHaveLength(1);
    expect(findings[0]).toMatchObject({ severity: 'error', keys: [3, 5], values: { keys: 3 } });
    expect(findings[0].message).toContain('not a finite number');
  });

  it('passes unit keys, and short keys at or above tolerances.zeroLength (threshold)', () => {
    const quats = steadyTurn([1, 0, 0], 1, 4);
    quats[2] = [0, 0, 0, 2e-6];
    const policy = { tolerances: { zeroLength: 1e-6 } };
    expect(runRule(notARotation, { channels: [channelFrom({ interpolation: 'LINEAR', quats })], policy })).toEqual([]);
    quats[2] = [0, 0, 0, 0.5e-6];
    const findings = runRule(notARotation, { channels: [channelFrom({ interpolation: 'LINEAR', quats })], policy });
    expect(findings[0]).toMatchObject({ keys: [2, 2] });
  });

  it('reports CUBICSPLINE tangents that are not finite (glTF 2.0 §3.6.2.2)', () => {
    const quats = steadyTurn([0, 1, 0], 1, 4);
    const outTangents = quats.map(() => [0, 0, 0, 0]);
    outTangents[1] = [0, NaN, 0, 0];
    const findings = runRule(notARotation, {
      channels: [channelFrom({ interpolation: 'CUBICSPLINE', quats, outTangents })]
    });
    expect(findings).toHaveLength(1);
    expect(findings[0]).toMatchObject({ keys: [1, 1], target: 'rotation:tangent' });
  });

  it('reports a node rest rotation that is no rotation', () => {
    const facts = factsFrom([
      nodeFrom({ nodePath: '/Lantern', rotation: [0, 0, 0, 0] }),
      nodeFrom({ nodePath: '/Buoy', rotation: [0, 0, 0, 1] })
    ]);
    const findings = runRule(notARotation, { facts });
    expect(findings).toHaveLength(1);
    expect(findings[0]).toMatchObject({ node: '/Lantern', keys: null, target: 'rest' });
  });
});

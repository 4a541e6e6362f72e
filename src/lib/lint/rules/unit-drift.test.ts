import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { unitDrift } from './unit-drift';
import { channelFrom, factsFrom, nodeFrom, runRule, steadyTurn } from './testing';

function scaled(q: readonly number[], length: number): number[] {
  return q.map((component) => component * length);
}

describe('unit-drift', () => {
  it('warns above 1e-3 and errs above 1e-2, grouping consecutive keys into one finding', () => {
    const quats: number[][] = steadyTurn([0, 1, 0], 1, 10);
    quats[2] = scaled(quats[2], 1.002);
    quats[3] = scaled(quats[3], 1.004);
    quats[7] = scaled(quats[7], 1.02);
    const findings = runRule(unitDrift, { channels: [channelFrom({ interpolation: 'LINEAR', quats })] });
    expect(findings.map((finding) => [finding.keys, finding.severity])).toEqual([
      [[2, 3], 'warning'],
      [[7, 7], 'error']
    ]);
    expect(findings[0].values).toMatchObject({ keys: 2, worstKey: 3 });
    // q·v·q* scales by |q|² (Hamilton product): 1.004² − 1 = 0.8016%.
    expect(findings[0].values.scalePercent as number).toBeCloseTo(0.8016, 3);
  });

  it('stays quiet just under the warning tolerance and speaks just over it (threshold)', () => {
    const quats: number[][] = steadyTurn([0, 1, 0], 1, 3);
    quats[1] = scaled(quats[1], 1 + 0.99e-3);
    expect(runRule(unitDrift, { channels: [channelFrom({ interpolation: 'LINEAR', quats })] })).toEqual([]);
    quats[1] = scaled(steadyTurn([0, 1, 0], 1, 3)[1], 1 + 1.01e-3);
    expect(runRule(unitDrift, { channels: [channelFrom({ interpolation: 'LINEAR', quats })] })).toHaveLength(1);
  });

  it('never reports random unit quaternions stored as float32', () => {
    const component = fc.double({ min: -1, max: 1, noNaN: true });
    fc.assert(
      fc.property(
        fc.array(fc.tuple(component, component, component, component), { minLength: 2, maxLength: 40 }),
        (raw) => {
          const quats = raw
            .filter((q) => Math.hypot(...q) > 0.1)
            .map((q) => {
              const length = Math.hypot(...q);
              return q.map((c) => c / length);
            });
          if (quats.length === 0) return;
          expect(runRule(unitDrift, { channels: [channelFrom({ interpolation: 'LINEAR', quats })] })).toEqual([]);
        }
      )
    );
  });

  it('lets the policy override the grading: every finding takes the override', () => {
    const quats: number[][] = steadyTurn([0, 1, 0], 1, 4);
    quats[1] = scaled(quats[1], 1.05);
    const findings = runRule(unitDrift, {
      channels: [channelFrom({ interpolation: 'LINEAR', quats })],
      policy: { rules: { 'unit-drift': 'info' } }
    });
    expect(findings[0].severity).toBe('info');
  });

  it('widens the tolerance to two encoding steps for normalized bytes (glTF 2.0 §3.11 decoding)', () => {
    const quats: number[][] = steadyTurn([0, 1, 0], 1, 4);
    // One signed-byte step is 1/127 (§3.11: f = c / 127), so two steps are 0.0157.
    quats[1] = scaled(quats[1], 1.012);
    const channel = channelFrom({
      interpolation: 'LINEAR',
      quats,
      quantizationStep: 1 / 127,
      raw: { componentType: 5120, normalized: true }
    });
    expect(runRule(unitDrift, { channels: [channel] })).toEqual([]);
    quats[1] = scaled(steadyTurn([0, 1, 0], 1, 4)[1], 1.02);
    const drifted = channelFrom({
      interpolation: 'LINEAR',
      quats,
      quantizationStep: 1 / 127,
      raw: { componentType: 5120, normalized: true }
    });
    expect(runRule(unitDrift, { channels: [drifted] })[0]).toMatchObject({
      severity: 'error',
      values: { tolerance: 2 / 127 }
    });
  });

  it('reports a drifted rest rotation', () => {
    const facts = factsFrom([nodeFrom({ nodePath: '/Keeper', rotation: [0, 0, 0, 1.003] })]);
    const findings = runRule(unitDrift, { facts });
    expect(findings).toHaveLength(1);
    expect(findings[0]).toMatchObject({ node: '/Keeper', severity: 'warning', target: 'rest' });
  });

  it('leaves zero and NaN keys to not-a-rotation', () => {
    const quats: number[][] = steadyTurn([0, 1, 0], 1, 4);
    quats[1] = [0, 0, 0, 0];
    quats[2] = [NaN, 0, 0, 1];
    expect(runRule(unitDrift, { channels: [channelFrom({ interpolation: 'LINEAR', quats })] })).toEqual([]);
  });
});

import { describe, expect, it } from 'vitest';
import { antipodalKeys } from './antipodal-keys';
import { axisAngle, channelFrom, runOnChannels } from './testing';

const q = axisAngle([0, 1, 0], 40);
const minusQ = q.map((component) => -component);

describe('antipodal-keys', () => {
  it('warns when a LINEAR key is the previous key negated', () => {
    const findings = runOnChannels(antipodalKeys, [
      channelFrom({ interpolation: 'LINEAR', quats: [q, minusQ, minusQ] })
    ]);
    expect(findings).toHaveLength(1);
    expect(findings[0]).toMatchObject({ severity: 'warning', keys: [0, 1] });
    expect(findings[0].values.distance as number).toBeLessThan(1e-6);
  });

  it('errs on CUBICSPLINE, where the curve between them passes through zero (Appendix C)', () => {
    const findings = runOnChannels(antipodalKeys, [channelFrom({ interpolation: 'CUBICSPLINE', quats: [q, minusQ] })]);
    expect(findings[0].severity).toBe('error');
  });

  it('ignores STEP channels and keys that are the same sign', () => {
    expect(runOnChannels(antipodalKeys, [channelFrom({ interpolation: 'STEP', quats: [q, minusQ] })])).toEqual([]);
    expect(runOnChannels(antipodalKeys, [channelFrom({ interpolation: 'LINEAR', quats: [q, q] })])).toEqual([]);
  });

  it('counts keys within tolerances.antipodal of −q and not beyond (threshold)', () => {
    const policy = { tolerances: { antipodal: 1e-3 } };
    // 0.1° off −q is a 4D distance of 2·sin(0.05°) = 8.7e-4, inside 1e-3; 0.15° is 1.3e-3, outside.
    const near = axisAngle([0, 1, 0], 40.1).map((component) => -component);
    const far = axisAngle([0, 1, 0], 40.15).map((component) => -component);
    expect(
      runOnChannels(antipodalKeys, [channelFrom({ interpolation: 'LINEAR', quats: [q, near] })], policy)
    ).toHaveLength(1);
    expect(runOnChannels(antipodalKeys, [channelFrom({ interpolation: 'LINEAR', quats: [q, far] })], policy)).toEqual(
      []
    );
  });
});

import { describe, expect, test } from 'vitest';
import { isRuleId } from '$lib/lint/rule-ids';
import { createCharacter } from '../character';
import { consecutiveDots, findTrack, listRotationTracks } from '../testing';
import { DEFECT_RULES, DEFECTS, defectStep } from './index';

describe('defect registry', () => {
  test('names a known rule for every defect except the valid quantized encoding', () => {
    for (const [name, rules] of Object.entries(DEFECT_RULES)) {
      expect(Object.keys(DEFECTS)).toContain(name);
      for (const rule of rules) expect(isRuleId(rule)).toBe(true);
      expect(rules.length === 0).toBe(name === 'quantizeRotations');
    }
  });

  test('a defect step applies its defect later and lists the rules it trips', () => {
    const step = defectStep('flipHemisphere', { animation: 'Tread', node: 'Hips', fromKey: 3 }, ['spline-dip']);
    expect(step.rules).toEqual(['hemisphere-jump', 'spline-dip']);
    const document = step.apply(createCharacter({ name: 'Fixture' }));
    expect(
      consecutiveDots(findTrack(listRotationTracks(document), 'Tread', 'Hips').keys).filter((dot) => dot < 0)
    ).toHaveLength(1);
  });
});

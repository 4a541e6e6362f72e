import { describe, expect, it } from 'vitest';
import { RULE_IDS } from '../rule-ids';
import { RULES } from './index';

describe('RULES', () => {
  it('lists every rule id except asset-unreadable, once each, in RULE_IDS order', () => {
    expect(RULES.map((rule) => rule.id)).toEqual(RULE_IDS.filter((id) => id !== 'asset-unreadable'));
  });

  it('gives every rule a title, rationale, source and a scope that matches its check', () => {
    for (const rule of RULES) {
      expect(rule.title.length, rule.id).toBeGreaterThan(10);
      expect(rule.rationale.length, rule.id).toBeGreaterThan(40);
      expect(rule.source.length, rule.id).toBeGreaterThan(5);
      expect(rule.check.length, rule.id).toBe(rule.scope === 'channel' ? 2 : 3);
    }
  });
});

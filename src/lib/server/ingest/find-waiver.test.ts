import { describe, expect, it } from 'vitest';
import { findWaiver, isInForce, type WaiverTerms } from './find-waiver';

const now = new Date('2026-03-01T12:00:00Z');
const finding = { fingerprint: 'a1b2c3d4e5f60718', rule: 'hemisphere-jump', asset: 'chars/kelp-diver.glb' };

const waiver = (overrides: Partial<WaiverTerms>): WaiverTerms => ({
  id: 1,
  scope: 'fingerprint',
  status: 'approved',
  fingerprint: finding.fingerprint,
  rule: null,
  assetPath: null,
  expiresAt: null,
  ...overrides
});

describe('findWaiver', () => {
  it('finds an approved fingerprint waiver for the same fingerprint', () => {
    expect(findWaiver(finding, [waiver({})], now)?.id).toBe(1);
  });

  it('finds an approved rule-asset waiver for the same rule and asset path', () => {
    const ruleAsset = waiver({
      scope: 'rule-asset',
      fingerprint: null,
      rule: 'hemisphere-jump',
      assetPath: finding.asset
    });
    expect(findWaiver(finding, [ruleAsset], now)?.id).toBe(1);
  });

  it.each([
    { why: 'another fingerprint', terms: { fingerprint: 'ffffffffffffffff' } },
    { why: 'a proposed waiver', terms: { status: 'proposed' } },
    { why: 'a rejected waiver', terms: { status: 'rejected' } },
    { why: 'a revoked waiver', terms: { status: 'revoked' } },
    { why: 'an expired waiver', terms: { expiresAt: new Date('2026-03-01T11:59:59Z') } },
    { why: 'a waiver expiring this very moment', terms: { expiresAt: now } },
    {
      why: 'a rule-asset waiver for another asset',
      terms: { scope: 'rule-asset', fingerprint: null, rule: 'hemisphere-jump', assetPath: 'chars/other.glb' }
    },
    {
      why: 'a rule-asset waiver for another rule',
      terms: { scope: 'rule-asset', fingerprint: null, rule: 'wide-arc', assetPath: finding.asset }
    }
  ] as { why: string; terms: Partial<WaiverTerms> }[])('ignores $why', ({ terms }) => {
    expect(findWaiver(finding, [waiver(terms)], now)).toBeNull();
  });

  it('keeps a waiver with a future expiry in force', () => {
    expect(isInForce(waiver({ expiresAt: new Date('2026-03-01T12:00:01Z') }), now)).toBe(true);
  });

  it('prefers a fingerprint waiver over a rule-asset one, then the oldest', () => {
    const ruleAsset = waiver({
      id: 1,
      scope: 'rule-asset',
      fingerprint: null,
      rule: finding.rule,
      assetPath: finding.asset
    });
    const newer = waiver({ id: 7 });
    const older = waiver({ id: 3 });
    expect(findWaiver(finding, [ruleAsset, newer, older], now)?.id).toBe(3);
  });
});

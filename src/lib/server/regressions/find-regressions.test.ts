import { describe, expect, it } from 'vitest';
import {
  findRegressions,
  medianTimeToFixMs,
  rankRegressingAssets,
  type BranchBuild,
  type BranchFinding
} from './find-regressions';

const HOUR_MS = 3_600_000;

function finding(fingerprint: string, overrides: Partial<BranchFinding> = {}): BranchFinding {
  return {
    fingerprint,
    rule: 'unit-drift',
    severity: 'error',
    assetPath: 'chars/hero.glb',
    status: 'new',
    ...overrides
  };
}

function build(id: number, findings: BranchFinding[], options: Partial<BranchBuild> = {}): BranchBuild {
  return {
    id,
    label: `#${id}`,
    createdAt: new Date(Date.UTC(2025, 2, 1) + id * HOUR_MS),
    checkedAssets: new Set(['chars/hero.glb', 'props/lamp.glb']),
    findings,
    isInRange: true,
    ...options
  };
}

describe('findRegressions', () => {
  it('measures the time from the build that introduced a new error to the first build without it', () => {
    const regressions = findRegressions([
      build(1, []),
      build(2, [finding('aa')]),
      build(3, [finding('aa', { status: 'unchanged' })]),
      build(5, [])
    ]);
    expect(regressions).toHaveLength(1);
    expect(regressions[0].introducedIn.id).toBe(2);
    expect(regressions[0].fixedIn?.id).toBe(5);
    expect(regressions[0].timeToFixMs).toBe(3 * HOUR_MS);
  });

  it('keeps a regression open while later builds leave its asset out', () => {
    const regressions = findRegressions([
      build(1, [finding('aa')]),
      build(2, [], { checkedAssets: new Set(['props/lamp.glb']) })
    ]);
    expect(regressions[0].fixedIn).toBeNull();
    expect(regressions[0].timeToFixMs).toBeNull();
  });

  it('counts a finding that stays new on a feature branch once, not in every build', () => {
    // On a feature branch the baseline is the base branch, so the finding stays `new` build after build.
    const regressions = findRegressions([build(1, [finding('aa')]), build(2, [finding('aa')]), build(3, [])]);
    expect(regressions).toHaveLength(1);
    expect(regressions[0].fixedIn?.id).toBe(3);
  });

  it('does not count what was already broken before the range as a regression', () => {
    const regressions = findRegressions([
      build(1, [finding('aa', { status: 'unchanged' })], { isInRange: false }),
      build(2, [finding('aa')])
    ]);
    expect(regressions).toEqual([]);
  });

  it('ignores findings that were unchanged against the baseline when they first show up', () => {
    expect(findRegressions([build(1, [finding('aa', { status: 'unchanged' })])])).toEqual([]);
  });

  it('counts a finding that comes back after a fix as a second regression', () => {
    const regressions = findRegressions([build(1, [finding('aa')]), build(2, []), build(3, [finding('aa')])]);
    expect(regressions.map((regression) => [regression.introducedIn.id, regression.fixedIn?.id ?? null])).toEqual([
      [1, 2],
      [3, null]
    ]);
  });
});

describe('medianTimeToFixMs', () => {
  it('takes the middle fixed time, averaging the two middle ones for an even count, and skips open ones', () => {
    const regressions = findRegressions([
      build(1, [finding('aa'), finding('bb'), finding('cc')]),
      build(2, [finding('bb'), finding('cc')]),
      build(5, [finding('cc')])
    ]);
    // aa fixed after 1 h, bb after 4 h, cc still open: median of [1 h, 4 h] is 2.5 h.
    expect(medianTimeToFixMs(regressions)).toBe(2.5 * HOUR_MS);
    expect(medianTimeToFixMs([])).toBeNull();
  });
});

describe('rankRegressingAssets', () => {
  it('ranks assets by the number of builds that regressed them', () => {
    const lamp = { assetPath: 'props/lamp.glb', rule: 'spin-spike' };
    const regressions = findRegressions([
      build(1, [finding('aa'), finding('l1', lamp)]),
      build(2, [finding('aa'), finding('l1', lamp), finding('l2', { ...lamp, severity: 'warning' })]),
      build(3, [finding('l1', lamp), finding('l2', { ...lamp, severity: 'warning' })])
    ]);
    const ranked = rankRegressingAssets(regressions);
    expect(
      ranked.map((row) => [row.assetPath, row.regressionBuilds, row.newErrors, row.newWarnings, row.stillOpen])
    ).toEqual([
      ['props/lamp.glb', 2, 1, 1, 2],
      ['chars/hero.glb', 1, 1, 0, 0]
    ]);
    expect(ranked[0].lastRegressedIn.id).toBe(2);
  });
});

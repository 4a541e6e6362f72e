import { describe, expect, it } from 'vitest';
import { formatBuildSummary } from './build-summary-text';
import type { BuildAnswer } from './post-build';

const FAILED: BuildAnswer = {
  id: 12,
  branch: 'feature/lantern-arm',
  commit: '3f2a9c1d0e5b7a8c9d0e1f2a3b4c5d6e7f8a9b0c',
  label: '#1483',
  verdict: 'fail',
  verdictReason: '1 new error: hemisphere-jump in chars/keeper.glb (/Keeper/LanternArm at 0.5 s)',
  counts: { error: 1, warning: 2, info: 0, new: 1, unchanged: 2, fixed: 0, waived: 1 },
  assetCount: 2,
  baselineBuildId: 11,
  reportUrl: 'https://orientry.lanternfish.example/projects/tidewatch/builds/12'
};

describe('formatBuildSummary', () => {
  it('gives the verdict, reason, counts, baseline comparison and report address of a failed build', () => {
    expect(formatBuildSummary(FAILED, { project: 'tidewatch', isExisting: false })).toBe(
      [
        'orientry: build 12 of tidewatch: gate FAILED',
        '  feature/lantern-arm at 3f2a9c1d0e5b (#1483), 2 assets',
        '  reason: 1 new error: hemisphere-jump in chars/keeper.glb (/Keeper/LanternArm at 0.5 s)',
        '  open findings: 1 error, 2 warnings, 0 info',
        '  against build 11: 1 new, 2 unchanged, 0 fixed, 1 waived',
        '  report: https://orientry.lanternfish.example/projects/tidewatch/builds/12',
        ''
      ].join('\n')
    );
  });

  it('says when there is no baseline yet, and leaves out what the build does not carry', () => {
    const first: BuildAnswer = {
      ...FAILED,
      id: 1,
      branch: 'main',
      commit: null,
      label: null,
      verdict: 'pass',
      verdictReason: null,
      counts: { error: 0, warning: 0, info: 0, new: 0, unchanged: 0, fixed: 0, waived: 0 },
      assetCount: 1,
      baselineBuildId: null
    };
    const lines = formatBuildSummary(first, { project: 'tidewatch', isExisting: false }).split('\n');
    expect(lines.slice(0, 4)).toEqual([
      'orientry: build 1 of tidewatch: gate passed',
      '  main, 1 asset',
      '  open findings: 0 errors, 0 warnings, 0 info',
      '  no baseline build yet: every finding counts as new'
    ]);
  });

  it('says so when the server answered a build it already had', () => {
    const text = formatBuildSummary(FAILED, { project: 'tidewatch', isExisting: true });
    expect(text).toContain('already submitted with this idempotency key');
  });
});

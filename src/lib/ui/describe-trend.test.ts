import { describe, expect, it } from 'vitest';
import { describeTrend } from './describe-trend';

describe('describeTrend', () => {
  it('says there is nothing yet for an empty series', () => {
    expect(describeTrend([], 'findings')).toBe('No builds yet.');
  });

  it('reads a single point without a direction', () => {
    expect(describeTrend([7], 'findings')).toBe('1 build: 7 findings.');
  });

  it('names first, latest, direction and range for a falling series', () => {
    expect(describeTrend([12, 9, 15, 4], 'findings')).toBe(
      '4 builds: 12 findings at first, 4 in the latest (fewer); range 4–15.'
    );
  });

  it('reports a rising series as "more"', () => {
    expect(describeTrend([0, 3], 'errors')).toBe('2 builds: 0 errors at first, 3 in the latest (more); range 0–3.');
  });

  it('reports a flat series as steady', () => {
    expect(describeTrend([2, 2, 2], 'findings', 'run')).toBe(
      '3 runs: 2 findings at first, 2 in the latest (unchanged); steady at 2.'
    );
  });
});

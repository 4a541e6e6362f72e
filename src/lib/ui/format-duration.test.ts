import { describe, expect, it } from 'vitest';
import { formatDuration } from './format-duration';

describe('formatDuration', () => {
  // Expected strings are our own display convention (common practice: ms below a second, then s, min, h).
  it.each([
    { durationMs: 0, expected: '0 ms' },
    { durationMs: 849.6, expected: '850 ms' },
    { durationMs: 1000, expected: '1 s' },
    { durationMs: 1234, expected: '1.2 s' },
    { durationMs: 9_949, expected: '9.9 s' },
    { durationMs: 14_400, expected: '14 s' },
    { durationMs: 59_400, expected: '59 s' },
    { durationMs: 125_000, expected: '2 min 05 s' },
    { durationMs: 3_599_000, expected: '59 min 59 s' },
    { durationMs: 3_780_000, expected: '1 h 03 min' },
    { durationMs: 26 * 3_600_000, expected: '26 h 00 min' }
  ])('shows $durationMs ms as "$expected"', ({ durationMs, expected }) => {
    expect(formatDuration(durationMs)).toBe(expected);
  });

  it('shows a dash for negative or non-finite input instead of a misleading number', () => {
    expect(formatDuration(-5)).toBe('—');
    expect(formatDuration(Number.NaN)).toBe('—');
    expect(formatDuration(Number.POSITIVE_INFINITY)).toBe('—');
  });
});

import { describe, expect, it } from 'vitest';
import { formatTimeToFix } from './format-time-to-fix';

const MINUTE_MS = 60_000;
const HOUR_MS = 60 * MINUTE_MS;
const DAY_MS = 24 * HOUR_MS;

describe('formatTimeToFix', () => {
  it.each([
    { durationMs: 20_000, expected: '1 min' },
    { durationMs: 40 * MINUTE_MS, expected: '40 min' },
    { durationMs: 5 * HOUR_MS + 20 * MINUTE_MS, expected: '5 h 20 min' },
    { durationMs: 2 * HOUR_MS, expected: '2 h' },
    { durationMs: 3 * DAY_MS + 4 * HOUR_MS + 10 * MINUTE_MS, expected: '3 d 4 h' },
    { durationMs: 2 * DAY_MS, expected: '2 d' },
    { durationMs: 20 * DAY_MS + 5 * HOUR_MS, expected: '20 d' },
    { durationMs: -1, expected: '—' }
  ])('writes $durationMs ms as "$expected"', ({ durationMs, expected }) => {
    expect(formatTimeToFix(durationMs)).toBe(expected);
  });
});

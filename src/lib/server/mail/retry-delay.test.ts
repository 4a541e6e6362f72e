import { describe, expect, it } from 'vitest';
import { RETRY_DEFAULTS, retryDelayMs } from './retry-delay';

const middle = () => 0.5;

describe('retryDelayMs', () => {
  it('waits the base delay after the first failed attempt', () => {
    expect(retryDelayMs(1, RETRY_DEFAULTS, middle)).toBe(15_000);
  });

  it('doubles the wait with every further attempt', () => {
    // Exponential back-off (common practice): base · 2^(attempt − 1).
    expect([2, 3, 4].map((attempt) => retryDelayMs(attempt, RETRY_DEFAULTS, middle))).toEqual([
      30_000, 60_000, 120_000
    ]);
  });

  it('never waits longer than the cap, also with jitter upwards', () => {
    expect(retryDelayMs(20, RETRY_DEFAULTS, () => 0.999)).toBe(RETRY_DEFAULTS.maxDelayMs);
  });

  it('spreads retries by a quarter either way', () => {
    expect(retryDelayMs(1, RETRY_DEFAULTS, () => 0)).toBe(11_250);
    expect(retryDelayMs(1, RETRY_DEFAULTS, () => 0.999999)).toBeCloseTo(18_750, -1);
  });
});

import { describe, expect, it } from 'vitest';
import { CliError } from './cli-error';
import { ExitCode } from './exit-codes';
import {
  backoffDelayMs,
  MAX_RETRY_AFTER_MS,
  parseRetryAfter,
  withRetries,
  type AttemptOutcome,
  type RetryNotice,
  type RetryPolicy
} from './retry-policy';

const POLICY: RetryPolicy = { retries: 4, baseDelayMs: 1000, maxDelayMs: 30_000 };

/** A sleep that records the waits instead of waiting. */
function recordingSleep(): { sleep: (delayMs: number) => Promise<void>; waits: number[] } {
  const waits: number[] = [];
  return { waits, sleep: async (delayMs) => void waits.push(delayMs) };
}

describe('backoffDelayMs', () => {
  // Equal jitter: ceiling/2 + random·ceiling/2, ceiling = min(max, base·2^index) (common practice).
  const rows: { retryIndex: number; random: number; expected: number }[] = [
    { retryIndex: 0, random: 0, expected: 500 },
    { retryIndex: 0, random: 0.999, expected: 999.5 },
    { retryIndex: 1, random: 0.5, expected: 1500 },
    { retryIndex: 2, random: 0.5, expected: 3000 },
    { retryIndex: 4, random: 0, expected: 8000 },
    // 2^5 s = 32 s passes the 30 s cap.
    { retryIndex: 5, random: 0, expected: 15_000 },
    { retryIndex: 12, random: 0.999, expected: 29_985 }
  ];
  for (const { retryIndex, random, expected } of rows) {
    it(`waits ${expected} ms before retry ${retryIndex + 1} when the jitter draws ${random}`, () => {
      expect(backoffDelayMs(retryIndex, POLICY, () => random)).toBeCloseTo(expected, 6);
    });
  }

  it('never waits at all with a zero base delay', () => {
    expect(backoffDelayMs(3, { ...POLICY, baseDelayMs: 0 }, () => 0.7)).toBe(0);
  });
});

describe('parseRetryAfter', () => {
  const nowMs = Date.parse('2025-03-01T12:00:00Z');
  // RFC 9110 §10.2.3: Retry-After = HTTP-date / delay-seconds.
  const rows: { value: string | null; expected: number | null }[] = [
    { value: null, expected: null },
    { value: '', expected: null },
    { value: '0', expected: 0 },
    { value: '7', expected: 7000 },
    { value: ' 12 ', expected: 12_000 },
    { value: 'Sat, 01 Mar 2025 12:00:30 GMT', expected: 30_000 },
    { value: 'Sat, 01 Mar 2025 11:59:00 GMT', expected: 0 },
    { value: '86400', expected: MAX_RETRY_AFTER_MS },
    { value: 'soon', expected: null },
    { value: '-5', expected: null }
  ];
  for (const { value, expected } of rows) {
    it(`reads ${JSON.stringify(value)} as ${expected} ms`, () => {
      expect(parseRetryAfter(value, nowMs)).toBe(expected);
    });
  }
});

describe('withRetries', () => {
  const retry = (reason: string, retryAfterMs: number | null = null): AttemptOutcome<string> => ({
    kind: 'retry',
    reason,
    retryAfterMs
  });

  it('returns the first success without waiting', async () => {
    const { sleep, waits } = recordingSleep();
    const value = await withRetries(async () => ({ kind: 'done', value: 'build 7' }), POLICY, 'POST x', { sleep });
    expect(value).toBe('build 7');
    expect(waits).toEqual([]);
  });

  it('retries with doubling waits until an attempt succeeds', async () => {
    const { sleep, waits } = recordingSleep();
    const notices: RetryNotice[] = [];
    const outcomes = [retry('ECONNREFUSED'), retry('HTTP 502'), retry('HTTP 503')];
    const seen: number[] = [];
    const value = await withRetries(
      async (attemptIndex) => {
        seen.push(attemptIndex);
        return outcomes.shift() ?? { kind: 'done', value: 'build 8' };
      },
      POLICY,
      'POST x',
      { sleep, random: () => 0, onRetry: (notice) => notices.push(notice) }
    );
    expect(value).toBe('build 8');
    expect(seen).toEqual([0, 1, 2, 3]);
    expect(waits).toEqual([500, 1000, 2000]);
    expect(notices.map((notice) => [notice.attempt, notice.attempts, notice.reason])).toEqual([
      [1, 5, 'ECONNREFUSED'],
      [2, 5, 'HTTP 502'],
      [3, 5, 'HTTP 503']
    ]);
  });

  it("waits as long as the server's Retry-After says instead of the backoff", async () => {
    const { sleep, waits } = recordingSleep();
    const outcomes = [retry('HTTP 429', 7000)];
    await withRetries(async () => outcomes.shift() ?? { kind: 'done', value: 'ok' }, POLICY, 'POST x', {
      sleep,
      random: () => 0
    });
    expect(waits).toEqual([7000]);
  });

  it('gives up after retries + 1 attempts with exit code 3 and the last reason', async () => {
    const { sleep, waits } = recordingSleep();
    let calls = 0;
    const failure = await withRetries(
      async () => {
        calls++;
        return retry(`ECONNREFUSED #${calls}`);
      },
      { ...POLICY, retries: 2 },
      'POST http://127.0.0.1:9/api/v1/projects/tidewatch/builds',
      { sleep, random: () => 0 }
    ).catch((error: unknown) => error);
    expect(calls).toBe(3);
    expect(waits).toHaveLength(2);
    expect(failure).toBeInstanceOf(CliError);
    expect((failure as CliError).exitCode).toBe(ExitCode.ServerUnreachable);
    expect((failure as CliError).code).toBe('server.unreachable');
    expect((failure as CliError).message).toBe(
      'POST http://127.0.0.1:9/api/v1/projects/tidewatch/builds: gave up after 3 attempts (ECONNREFUSED #3)'
    );
  });

  it('makes exactly one attempt with --retries 0', async () => {
    const { sleep, waits } = recordingSleep();
    let calls = 0;
    const failure = await withRetries(
      async () => {
        calls++;
        return retry('HTTP 500');
      },
      { ...POLICY, retries: 0 },
      'POST x',
      { sleep }
    ).catch((error: unknown) => error);
    expect(calls).toBe(1);
    expect(waits).toEqual([]);
    expect((failure as CliError).message).toContain('gave up after 1 attempt (HTTP 500)');
  });

  it('lets an error thrown by an attempt through at once, without retrying', async () => {
    const { sleep } = recordingSleep();
    let calls = 0;
    const refusal = new CliError('server.refused', 'refused', ExitCode.ServerUnreachable);
    const failure = await withRetries(
      async () => {
        calls++;
        throw refusal;
      },
      POLICY,
      'POST x',
      { sleep }
    ).catch((error: unknown) => error);
    expect(failure).toBe(refusal);
    expect(calls).toBe(1);
  });
});

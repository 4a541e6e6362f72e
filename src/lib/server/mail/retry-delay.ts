/**
 * How long the outbox waits before trying a message again: exponential back-off with jitter,
 * so a mail server that is down for a while is not hammered, and many queued messages do not
 * all come back in the same second. Common practice (doubling from a base, capped, ±25 %).
 */

/** Retry settings of the mail worker. */
export interface RetryOptions {
  /** Wait after the first failed attempt. */
  baseDelayMs: number;
  /** Longest wait between two attempts. */
  maxDelayMs: number;
  /** Attempts before a message is marked failed for good. */
  maxAttempts: number;
}

/** Defaults: 15 s, 30 s, 1 min … capped at 1 h; 8 attempts span about half an hour. */
export const RETRY_DEFAULTS: RetryOptions = { baseDelayMs: 15_000, maxDelayMs: 60 * 60 * 1000, maxAttempts: 8 };

/**
 * Delay before the next attempt after `attemptsMade` attempts (1 after the first failure).
 * @param random a number in [0, 1) for the jitter; tests pass a fixed one.
 *
 * @example retryDelayMs(1, RETRY_DEFAULTS, () => 0.5) → 15000; retryDelayMs(3, RETRY_DEFAULTS, () => 0.5) → 60000
 */
export function retryDelayMs(attemptsMade: number, options: RetryOptions, random: () => number = Math.random): number {
  const exponent = Math.min(Math.max(attemptsMade - 1, 0), 30);
  const delay = Math.min(options.maxDelayMs, options.baseDelayMs * 2 ** exponent);
  const jitter = 0.75 + 0.5 * random();
  return Math.round(Math.min(options.maxDelayMs, delay * jitter));
}

/**
 * When and how long `submit` waits before trying a request again: exponential backoff with
 * jitter for network errors and 5xx answers, and the server's own Retry-After for 429 (and 503).
 * Every attempt sends the same idempotency key, so a retry after a build was stored in fact
 * answers that build instead of storing a second one.
 *
 * Design notes: "equal jitter" (half the ceiling fixed, half random) keeps a floor under each
 * wait, so a retry never fires at once, while many CI jobs failing together still spread out
 * (common practice for backoff against a shared server).
 */
import { CliError } from './cli-error';
import { ExitCode } from './exit-codes';

/** How often and how patiently to retry. */
export interface RetryPolicy {
  /** Retries after the first attempt (0 means one attempt only). */
  retries: number;
  /** Ceiling of the first wait; each later one doubles it. */
  baseDelayMs: number;
  /** No wait ceiling grows beyond this. */
  maxDelayMs: number;
}

/** The longest Retry-After honoured; a server asking for more is waited on this long. */
export const MAX_RETRY_AFTER_MS = 5 * 60_000;

/** Wait ceiling default: half a minute between attempts is patient enough for a restarting server. */
export const MAX_BACKOFF_MS = 30_000;

/** What one attempt came to. */
export type AttemptOutcome<T> =
  | { kind: 'done'; value: T }
  /** Worth trying again: a network error, a timeout, a 5xx or 429 answer. */
  | { kind: 'retry'; reason: string; retryAfterMs: number | null };

/** What the caller learns before each wait. */
export interface RetryNotice {
  /** The attempt that failed, 1-based. */
  attempt: number;
  attempts: number;
  reason: string;
  delayMs: number;
}

/** Side effects of waiting, injected so tests run without real time. */
export interface RetryHooks {
  sleep(delayMs: number): Promise<void>;
  /** A number in [0, 1); Math.random by default. */
  random?: () => number;
  onRetry?(notice: RetryNotice): void;
}

/**
 * The wait before retry `retryIndex` (0 for the first retry): a ceiling of base · 2^index, capped
 * at `maxDelayMs`, of which half is fixed and half random.
 * @example backoffDelayMs(2, { retries: 4, baseDelayMs: 1000, maxDelayMs: 30000 }, () => 0.5) → 3000
 */
export function backoffDelayMs(retryIndex: number, policy: RetryPolicy, random: () => number = Math.random): number {
  const ceiling = Math.min(policy.maxDelayMs, policy.baseDelayMs * 2 ** retryIndex);
  return ceiling / 2 + (random() * ceiling) / 2;
}

/**
 * A Retry-After header value in milliseconds from `nowMs`: delay-seconds or an HTTP-date
 * (RFC 9110 §10.2.3), capped at {@link MAX_RETRY_AFTER_MS}. null when absent or unreadable.
 * @example parseRetryAfter('120', Date.now()) → 120000
 */
export function parseRetryAfter(value: string | null, nowMs: number): number | null {
  if (value === null || value.trim() === '') return null;
  const text = value.trim();
  let delayMs: number;
  if (/^\d+$/.test(text)) delayMs = Number(text) * 1000;
  else {
    // An HTTP-date always names its month ("Sat, 01 Mar 2025 ..."); Date.parse alone takes "-5" for a year.
    const dateMs = /[a-z]{3}/i.test(text) ? Date.parse(text) : Number.NaN;
    if (Number.isNaN(dateMs)) return null;
    delayMs = dateMs - nowMs;
  }
  return Math.min(MAX_RETRY_AFTER_MS, Math.max(0, delayMs));
}

/**
 * Runs `attempt` until it is done or the retries are used up.
 * @param target what is being reached, for the final message (`POST https://orientry.example/...`).
 * @throws CliError `server.unreachable` (exit 3) naming the attempts and the last reason, and
 *   whatever `attempt` itself throws (an answer not worth retrying, an unreadable input file).
 */
export async function withRetries<T>(
  attempt: (attemptIndex: number) => Promise<AttemptOutcome<T>>,
  policy: RetryPolicy,
  target: string,
  hooks: RetryHooks
): Promise<T> {
  const attempts = policy.retries + 1;
  for (let attemptIndex = 0; ; attemptIndex++) {
    const outcome = await attempt(attemptIndex);
    if (outcome.kind === 'done') return outcome.value;
    if (attemptIndex + 1 >= attempts) {
      throw new CliError(
        'server.unreachable',
        `${target}: gave up after ${attempts} attempt${attempts === 1 ? '' : 's'} (${outcome.reason})`,
        ExitCode.ServerUnreachable
      );
    }
    const delayMs = outcome.retryAfterMs ?? backoffDelayMs(attemptIndex, policy, hooks.random);
    hooks.onRetry?.({ attempt: attemptIndex + 1, attempts, reason: outcome.reason, delayMs });
    await hooks.sleep(delayMs);
  }
}

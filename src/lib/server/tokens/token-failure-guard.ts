/**
 * A brake on guessing API token secrets: API requests that present an `Authorization` header
 * and are refused with 401 are counted per client address, and an address with
 * {@link TOKEN_FAILURE_LIMIT} failures inside the window gets 429 with Retry-After on every
 * request that presents a token, before the token is looked at (a right guess included, or the
 * brake would not slow a guesser down). Requests without the header (sessions) are not counted.
 * In memory, like the sign-in limiter: a restart forgets, several servers count separately.
 */
import type { Handle } from '@sveltejs/kit';
import { SignInLimiter } from '../auth/sign-in-limiter';
import { apiError } from '../ingest/api-error';

/** 20 refused tokens a minute per client address (common practice for an API key brake). */
export const TOKEN_FAILURE_LIMIT = { maxFailures: 20, windowSeconds: 60 } as const;

// The sign-in limiter's sliding window fits as is: keys here are client addresses.
let limiter: SignInLimiter | undefined;

/** The process-wide counter of refused tokens. */
function tokenFailureLimiter(): SignInLimiter {
  limiter ??= new SignInLimiter(TOKEN_FAILURE_LIMIT.maxFailures, TOKEN_FAILURE_LIMIT.windowSeconds * 1000);
  return limiter;
}

/** Counts refused API tokens per client address and answers 429 past the limit; see the file comment. */
export const tokenFailureGuard: Handle = async ({ event, resolve }) => {
  if (!event.url.pathname.startsWith('/api/') || !event.request.headers.has('authorization')) return resolve(event);
  const address = event.getClientAddress();
  const waitSeconds = tokenFailureLimiter().retryAfterSeconds(address);
  if (waitSeconds > 0) {
    return apiError(
      429,
      'auth.token-rate-limited',
      `Authorization: more than ${TOKEN_FAILURE_LIMIT.maxFailures} refused API tokens from this address within ` +
        `${TOKEN_FAILURE_LIMIT.windowSeconds} s. Wait ${waitSeconds} s, then check the token in your CI settings.`,
      { 'retry-after': String(waitSeconds) }
    );
  }
  const response = await resolve(event);
  if (response.status === 401) tokenFailureLimiter().recordFailure(address);
  return response;
};

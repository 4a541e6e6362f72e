import type { Handle } from '@sveltejs/kit';
import { getSignInLimiter, signInLimiterKey } from './sign-in-limiter';

const CALLBACK_PATH = '/auth/callback/credentials';

/**
 * Applies the sign-in rate limit to direct posts to Auth.js's credentials callback too, so
 * the limit cannot be dodged by skipping the sign-in form. Runs before the Auth.js handle.
 */
export const credentialsCallbackGuard: Handle = async ({ event, resolve }) => {
  if (event.request.method !== 'POST' || event.url.pathname !== CALLBACK_PATH) return resolve(event);
  // A body that is not a form cannot sign anyone in (Auth.js refuses it), so it counts under an empty e-mail.
  const form = await event.request
    .clone()
    .formData()
    .catch(() => null);
  const email = String(form?.get('email') ?? '');
  const limiter = getSignInLimiter();
  const key = signInLimiterKey(email, event.getClientAddress());
  const waitSeconds = limiter.retryAfterSeconds(key);
  if (waitSeconds > 0) {
    return new Response('Too many failed sign-ins. Try again later.', {
      status: 429,
      headers: { 'retry-after': String(waitSeconds) }
    });
  }
  const response = await resolve(event);
  const location = response.headers.get('location') ?? '';
  if (location.includes('error=CredentialsSignin')) limiter.recordFailure(key);
  else if (response.status >= 300 && response.status < 400) limiter.reset(key);
  return response;
};

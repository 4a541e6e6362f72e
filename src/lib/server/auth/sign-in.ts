import { fail, isRedirect, type ActionFailure, type RequestEvent } from '@sveltejs/kit';
import { CredentialsSignin } from '@auth/sveltekit';
import { z } from 'zod';
import { authSignIn } from './auth-js';
import { safeRedirectPath } from './safe-redirect';
import { getSignInLimiter, signInLimiterKey } from './sign-in-limiter';

/** What the sign-in form gets back when signing in fails: the e-mail to refill and one message. */
export interface SignInFailure {
  email: string;
  error: string;
}

const formSchema = z.object({
  email: z.string().trim().min(1).max(320),
  password: z.string().min(1).max(1000),
  redirectTo: z.string().optional()
});

/**
 * The sign-in form action: checks the rate limit, then signs in through Auth.js so it sets the
 * session cookie, and redirects to `redirectTo` (a same-site path) on success.
 * Returns `fail(400 | 429, { email, error })` so the form re-renders with the address kept.
 */
export async function signInWithPassword(event: RequestEvent): Promise<ActionFailure<SignInFailure>> {
  const form = Object.fromEntries(await event.request.formData());
  const parsed = formSchema.safeParse(form);
  const email = typeof form.email === 'string' ? form.email.trim() : '';
  if (!parsed.success) return fail(400, { email, error: 'Enter your e-mail address and your password.' });

  const limiter = getSignInLimiter();
  const key = signInLimiterKey(parsed.data.email, event.getClientAddress());
  const waitSeconds = limiter.retryAfterSeconds(key);
  if (waitSeconds > 0) {
    const minutes = Math.ceil(waitSeconds / 60);
    return fail(429, {
      email,
      error: `Too many failed sign-ins for ${email}. Wait ${minutes} minute${minutes === 1 ? '' : 's'} and try again.`
    });
  }

  const body = new URLSearchParams({
    providerId: 'credentials',
    email: parsed.data.email,
    password: parsed.data.password,
    redirectTo: safeRedirectPath(parsed.data.redirectTo)
  });
  const headers = new Headers(event.request.headers);
  headers.delete('content-length');
  headers.set('content-type', 'application/x-www-form-urlencoded');
  try {
    // Auth.js's action reads provider and fields from the request body, which this action
    // has already read, so it gets a fresh request with the same headers (cookies, origin).
    await authSignIn({ ...event, request: new Request(event.url, { method: 'POST', headers, body }) });
  } catch (error) {
    if (isRedirect(error)) {
      limiter.reset(key);
      throw error;
    }
    if (error instanceof CredentialsSignin) {
      limiter.recordFailure(key);
      return fail(400, { email, error: 'That e-mail and password do not match an active account.' });
    }
    throw error;
  }
  throw new Error('Auth.js finished signing in without redirecting; the session state is unknown.');
}

import { json, redirect, type Handle } from '@sveltejs/kit';

/**
 * Paths anyone may open: the sign-in page, sign-out, the bundled CLI (CI downloads it), Auth.js's
 * own routes, health, and the token-authenticated API.
 */
const PUBLIC_PATHS = ['/signin', '/signout', '/cli/orientry.js'];
const PUBLIC_PREFIXES = ['/auth/', '/api/health', '/api/v1/', '/_app/'];

/**
 * Requires sign-in for everything else: pages redirect to `/signin?redirectTo=<path>`, other
 * API routes answer 401 with `{ error: { code, message } }`. Runs after the user handle.
 */
export const signInRequiredHandle: Handle = async ({ event, resolve }) => {
  const path = event.url.pathname;
  if (event.locals.user || PUBLIC_PATHS.includes(path) || PUBLIC_PREFIXES.some((prefix) => path.startsWith(prefix))) {
    return resolve(event);
  }
  if (path.startsWith('/api/')) {
    return json({ error: { code: 'auth.required', message: 'Sign in first.' } }, { status: 401 });
  }
  const target = path + event.url.search;
  redirect(303, target === '/' ? '/signin' : `/signin?redirectTo=${encodeURIComponent(target)}`);
};

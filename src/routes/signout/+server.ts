import { redirect } from '@sveltejs/kit';
import { authSignOut } from '$lib/server/auth/auth-js';
import type { RequestHandler } from './$types';

/**
 * Signs out: a form `POST /signout` clears the session cookie and lands on /signin.
 * POST only, so a link or a prefetch cannot sign anyone out.
 */
export const POST: RequestHandler = async (event) => {
  const body = new URLSearchParams({ redirectTo: '/signin' });
  const headers = new Headers(event.request.headers);
  headers.delete('content-length');
  headers.set('content-type', 'application/x-www-form-urlencoded');
  // Auth.js's sign-out action reads its options from a form body, so it gets one with redirectTo.
  await authSignOut({ ...event, request: new Request(event.url, { method: 'POST', headers, body }) });
  redirect(303, '/signin');
};

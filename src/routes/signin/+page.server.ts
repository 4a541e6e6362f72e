import { redirect } from '@sveltejs/kit';
import { safeRedirectPath } from '$lib/server/auth/safe-redirect';
import { signInWithPassword } from '$lib/server/auth/sign-in';
import type { Actions, PageServerLoad } from './$types';

/** The sign-in page: signed-in visitors go straight on; others get the form with `redirectTo` kept. */
export const load: PageServerLoad = async ({ locals, url }) => {
  const redirectTo = safeRedirectPath(url.searchParams.get('redirectTo'));
  if (locals.user) redirect(303, redirectTo);
  return { redirectTo };
};

export const actions: Actions = {
  /** Form fields `email`, `password`, `redirectTo`; fails with `{ email, error }` (400, or 429 when rate-limited). */
  default: signInWithPassword
};

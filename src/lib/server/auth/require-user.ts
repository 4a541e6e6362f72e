import { error } from '@sveltejs/kit';
import type { SessionUser } from '../../types/session-user';

/**
 * The signed-in user of a request, for `load` functions and actions. The server hook already
 * sends anonymous page requests to /signin; this is the typed backstop (HTTP 401).
 */
export function requireUser(locals: Pick<App.Locals, 'user'>): SessionUser {
  if (!locals.user) error(401, { message: 'Sign in to continue.', code: 'auth.required' });
  return locals.user;
}

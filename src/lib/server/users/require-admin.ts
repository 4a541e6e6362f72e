import { error } from '@sveltejs/kit';
import type { SessionUser } from '../../types/session-user';
import { requireUser } from '../auth/require-user';

/**
 * Route guard for the admin pages: the signed-in user when they are a site admin; otherwise
 * 401 without a session and 403 for everyone else (hiding the menu entry is not enough).
 */
export function requireAdmin(locals: Pick<App.Locals, 'user'>): SessionUser {
  const user = requireUser(locals);
  if (user.role !== 'admin') {
    error(403, { message: 'Only admins manage users and invitations. Ask an admin.', code: 'auth.admin-required' });
  }
  return user;
}

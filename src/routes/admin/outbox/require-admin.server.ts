/**
 * The mail outbox is for admins only: messages carry other people's addresses and signed links.
 * Every load and action of these pages calls this; the menu link is only a convenience.
 */
import { error } from '@sveltejs/kit';
import { requireUser } from '$lib/server/auth/require-user';
import type { SessionUser } from '$lib/types/session-user';

/** The signed-in admin, or HTTP 403 for anyone else (401 when signed out). */
export function requireAdmin(locals: Pick<App.Locals, 'user'>): SessionUser {
  const user = requireUser(locals);
  if (user.role !== 'admin') error(403, { message: 'Only admins can open the mail outbox.', code: 'auth.admin-only' });
  return user;
}

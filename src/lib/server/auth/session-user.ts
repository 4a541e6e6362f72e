import type { SessionUser } from '../../types/session-user';
import { User } from '../db/models';

/** The public part of a user row, as pages see it. */
export function toSessionUser(user: User): SessionUser {
  return { id: user.id, email: user.email, name: user.name, role: user.role };
}

/**
 * The user behind a session, read fresh from the database: null when the account is gone
 * or disabled, which is how a disabled user loses access on their next request.
 */
export async function findSessionUser(id: number): Promise<SessionUser | null> {
  const user = await User.findByPk(id);
  if (!user || user.disabledAt) return null;
  return toSessionUser(user);
}

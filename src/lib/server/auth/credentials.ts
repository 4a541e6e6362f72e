import type { SessionUser } from '../../types/session-user';
import { User } from '../db/models';
import { hashPassword, verifyPassword } from './password';
import { toSessionUser } from './session-user';

/**
 * A bcrypt hash of a random string, compared against when the e-mail is unknown so a wrong
 * address takes as long as a wrong password and does not reveal which accounts exist.
 */
let unknownUserHash: Promise<string> | undefined;

/**
 * Checks an e-mail and password against the users table: the signed-in user on success,
 * null for an unknown address, a wrong password or a disabled account.
 */
export async function verifyCredentials(email: string, password: string): Promise<SessionUser | null> {
  const user = await User.findOne({ where: { email: email.trim().toLowerCase() } });
  unknownUserHash ??= hashPassword(crypto.randomUUID());
  const matches = await verifyPassword(password, user?.passwordHash ?? (await unknownUserHash));
  if (!user || !matches || user.disabledAt) return null;
  return toSessionUser(user);
}

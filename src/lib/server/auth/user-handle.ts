import type { Handle } from '@sveltejs/kit';
import { findSessionUser } from './session-user';

/** Paths that never look at the session: machines call them, with their own credentials or none. */
const SESSIONLESS_PREFIXES = ['/api/health', '/api/v1/'];

/**
 * Puts the signed-in user on `locals.user` (or null), read from the Auth.js session and then
 * from the database, so a disabled or deleted account stops working at once.
 */
export const userHandle: Handle = async ({ event, resolve }) => {
  event.locals.user = null;
  if (SESSIONLESS_PREFIXES.some((prefix) => event.url.pathname.startsWith(prefix))) return resolve(event);
  const session = await event.locals.auth();
  const id = Number(session?.user?.id);
  if (Number.isSafeInteger(id) && id > 0) event.locals.user = await findSessionUser(id);
  return resolve(event);
};

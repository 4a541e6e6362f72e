/**
 * Pages reached from e-mail links without signing in: the unsubscribe confirmation, the password
 * reset and the invitation. Their links carry their own proof, and a person who forgot the
 * password, or has no account yet, cannot sign in first. {@link allowMailLinkPaths} lets these through a sign-in wall.
 */
import type { Handle } from '@sveltejs/kit';

/**
 * True for a path a mail link opens: `/unsubscribe/<token>`, `/reset`, `/reset/<token>` and
 * `/invite/<token>` (with their data requests).
 */
export function isMailLinkPath(path: string): boolean {
  return (
    path === '/reset' || path.startsWith('/reset/') || path.startsWith('/unsubscribe/') || path.startsWith('/invite/')
  );
}

/** Wraps a sign-in wall so mail-link pages skip it; every other request goes through `wall`. */
export function allowMailLinkPaths(wall: Handle): Handle {
  return ({ event, resolve }) => (isMailLinkPath(event.url.pathname) ? resolve(event) : wall({ event, resolve }));
}

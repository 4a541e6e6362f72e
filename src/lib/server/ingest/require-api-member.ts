/**
 * Who may read a project through the API: a signed-in member with at least a given role.
 * API routes skip the page session hook, so the session is read here when a route needs it.
 */
import type { RequestEvent } from '@sveltejs/kit';
import type { ProjectRole } from '../../types/roles';
import type { SessionUser } from '../../types/session-user';
import { getProjectAccess, type ProjectAccess } from '../auth/project-access';
import { findSessionUser } from '../auth/session-user';
import { ApiError } from './api-error';

/**
 * The project `slug` and the caller's standing in it.
 * @throws ApiError 401 `auth.required` without a session; NotFoundError (404) for an unknown
 *   project or a non-member; ForbiddenError (403) below `minimumRole`.
 */
export async function requireApiMember(
  event: Pick<RequestEvent, 'locals'>,
  slug: string,
  minimumRole: ProjectRole
): Promise<ProjectAccess & { user: SessionUser }> {
  const user = event.locals.user ?? (await sessionUserOf(event.locals));
  if (!user) {
    throw new ApiError(401, 'auth.required', 'Sign in first: this part of the API needs a signed-in project member.');
  }
  return { ...(await getProjectAccess(user, slug, minimumRole)), user };
}

async function sessionUserOf(locals: App.Locals): Promise<SessionUser | null> {
  const session = await locals.auth();
  const id = Number(session?.user?.id);
  return Number.isSafeInteger(id) && id > 0 ? findSessionUser(id) : null;
}

import { error } from '@sveltejs/kit';
import type { ProjectRole } from '../../types/roles';
import { ForbiddenError, NotFoundError } from '../errors';
import { getProjectAccess, type ProjectAccess } from './project-access';
import { requireUser } from './require-user';

/**
 * Route guard: the project `projectSlug` and the user's role in it, when the user holds at least
 * `minimumRole` (admins always do). Non-members get 404, members below the role get 403, as
 * SvelteKit errors with the message and `code` of {@link getProjectAccess}'s typed errors.
 *
 * @example const { project, role } = await requireProjectRole(locals, params.slug, 'lead');
 */
export async function requireProjectRole(
  locals: Pick<App.Locals, 'user'>,
  projectSlug: string,
  minimumRole: ProjectRole = 'viewer'
): Promise<ProjectAccess> {
  const user = requireUser(locals);
  try {
    return await getProjectAccess(user, projectSlug, minimumRole);
  } catch (caught) {
    if (caught instanceof NotFoundError || caught instanceof ForbiddenError) {
      error(caught.status, { message: caught.message, code: caught.code });
    }
    throw caught;
  }
}

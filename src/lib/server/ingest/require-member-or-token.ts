/**
 * Who may read what CI needs back from a build: a signed-in project member, or the project's own
 * API token. The token lets `orientry submit --format sarif` download the report the server
 * rendered (with the project's policy, baseline standing and waivers) with the secret it
 * uploaded with, where no browser session exists.
 */
import type { RequestEvent } from '@sveltejs/kit';
import type { ApiTokenScope } from '../db/models/api-token';
import { Project } from '../db/models';
import type { ProjectRole } from '../../types/roles';
import * as apiTokens from '../tokens/api-tokens';
import { ApiError } from './api-error';
import { requireApiMember } from './require-api-member';

/** What the caller proved: membership (with a role) or the project's token. */
export type ProjectReader =
  { project: Project; via: 'session'; role: ProjectRole } | { project: Project; via: 'token' };

/**
 * The project `slug` when the request carries `Authorization: Bearer <token>` of that project
 * with `scope`, or else a session of a member with at least `minimumRole`.
 * A bearer header is never ignored: a bad token fails even when a session cookie is present,
 * so a CI job learns that its secret is wrong.
 * @throws ApiError 404 `project.not-found` for an unknown slug on the token path; 401/403
 *   `auth.token-*` from token verification; the member errors of {@link requireApiMember}.
 */
export async function requireMemberOrToken(
  event: Pick<RequestEvent, 'locals' | 'request'>,
  slug: string,
  options: { minimumRole: ProjectRole; scope: ApiTokenScope }
): Promise<ProjectReader> {
  const authorization = event.request.headers.get('authorization');
  if (authorization === null || authorization.trim() === '') {
    const { project, role } = await requireApiMember(event, slug, options.minimumRole);
    return { project, via: 'session', role };
  }
  const project = await Project.findOne({ where: { slug } });
  if (!project) {
    throw new ApiError(404, 'project.not-found', `There is no project "${slug}". Check the project slug.`);
  }
  await apiTokens.verify(authorization, project, options.scope);
  return { project, via: 'token' };
}

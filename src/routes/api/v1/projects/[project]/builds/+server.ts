/**
 * Builds of a project.
 * - POST: CI submits a build (multipart: `file` parts named by relative path, one `meta` JSON part),
 *   authorized by a project API token with the `submit` scope. 201 with the new build, 200 with
 *   the existing one for a repeated idempotency key (in meta, or in the `Idempotency-Key` header,
 *   which is answered before the body is read).
 * - GET: the paged build list, for signed-in project members.
 */
import { json } from '@sveltejs/kit';
import { summarizeBuild } from '$lib/server/builds/build-summary';
import { listBuilds, listBuildsQuerySchema } from '$lib/server/builds/list-builds';
import { Project } from '$lib/server/db/models';
import { ApiError } from '$lib/server/ingest/api-error';
import { apiHandler } from '$lib/server/ingest/api-handler';
import { ingestBuild } from '$lib/server/ingest/ingest-build';
import { parseQuery } from '$lib/server/ingest/parse-query';
import { requireApiMember } from '$lib/server/ingest/require-api-member';
import * as apiTokens from '$lib/server/tokens/api-tokens';
import type { RequestHandler } from './$types';

/** Ingests a build from CI (token-authorized). */
export const POST: RequestHandler = apiHandler(async ({ params, request, url }) => {
  const project = await Project.findOne({ where: { slug: params.project } });
  if (!project) {
    throw new ApiError(404, 'project.not-found', `There is no project "${params.project}". Check the project slug.`);
  }
  // The token is checked before a byte of the body is read.
  await apiTokens.verify(request.headers.get('authorization'), project, 'submit');
  const { build, isExisting } = await ingestBuild(project, request, url.origin);
  return json({ build: summarizeBuild(build, project.slug, url.origin) }, { status: isExisting ? 200 : 201 });
});

/** Lists the project's builds, paged. */
export const GET: RequestHandler = apiHandler(async (event) => {
  const { project } = await requireApiMember(event, event.params.project, 'viewer');
  const query = parseQuery(event.url.searchParams, listBuildsQuerySchema);
  return json(await listBuilds(project, query, event.url.origin));
});

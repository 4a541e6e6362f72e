/**
 * GET the findings of a build, paged and filtered by `rule`, `severity`, `asset` and
 * `status` (new, unchanged, fixed, waived), for signed-in project members.
 */
import { json } from '@sveltejs/kit';
import { getProjectBuild } from '$lib/server/builds/get-project-build';
import { listFindings, listFindingsQuerySchema } from '$lib/server/builds/list-findings';
import { apiHandler } from '$lib/server/ingest/api-handler';
import { parseQuery } from '$lib/server/ingest/parse-query';
import { requireApiMember } from '$lib/server/ingest/require-api-member';
import type { RequestHandler } from './$types';

/** A page of the build's findings. */
export const GET: RequestHandler = apiHandler(async (event) => {
  const { project } = await requireApiMember(event, event.params.project, 'viewer');
  const build = await getProjectBuild(project.id, event.params.id);
  return json(await listFindings(build.id, parseQuery(event.url.searchParams, listFindingsQuerySchema)));
});

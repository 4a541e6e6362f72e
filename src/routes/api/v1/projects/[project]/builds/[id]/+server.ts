/** GET one build of a project with its assets, counts and baseline, for signed-in project members. */
import { json } from '@sveltejs/kit';
import { getBuildDetail } from '$lib/server/builds/get-build-detail';
import { getProjectBuild } from '$lib/server/builds/get-project-build';
import { apiHandler } from '$lib/server/ingest/api-handler';
import { requireApiMember } from '$lib/server/ingest/require-api-member';
import type { RequestHandler } from './$types';

/** The build with its assets. */
export const GET: RequestHandler = apiHandler(async (event) => {
  const { project } = await requireApiMember(event, event.params.project, 'viewer');
  const build = await getProjectBuild(project.id, event.params.id);
  return json(await getBuildDetail(build, project.slug, event.url.origin));
});

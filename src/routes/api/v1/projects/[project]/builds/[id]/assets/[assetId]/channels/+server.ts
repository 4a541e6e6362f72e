/**
 * GET one asset's rotation channels as plot series (times, x/y/z/w, length, angular speed,
 * finding markers), read from its stored file, for signed-in project members.
 */
import { json } from '@sveltejs/kit';
import { getAssetChannels } from '$lib/server/builds/get-asset-channels';
import { getProjectBuild } from '$lib/server/builds/get-project-build';
import { apiHandler } from '$lib/server/ingest/api-handler';
import { requireApiMember } from '$lib/server/ingest/require-api-member';
import type { RequestHandler } from './$types';

/** The asset's rotation channels as plot series. */
export const GET: RequestHandler = apiHandler(async (event) => {
  const { project } = await requireApiMember(event, event.params.project, 'viewer');
  const build = await getProjectBuild(project.id, event.params.id);
  return json(await getAssetChannels(build.id, event.params.assetId));
});

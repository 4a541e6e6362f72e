/**
 * GET one asset's rotation channels as plot series (times, x/y/z/w, length, angular speed,
 * finding markers), read from its stored file, for signed-in project members. `?channel=2:5`
 * answers only channel 5 of animation 2; one answer carries at most 200,000 keys (422
 * `channels.too-many-keys` says to ask per channel).
 */
import { json } from '@sveltejs/kit';
import { assetChannelsQuerySchema, getAssetChannels } from '$lib/server/builds/get-asset-channels';
import { getProjectBuild } from '$lib/server/builds/get-project-build';
import { apiHandler } from '$lib/server/ingest/api-handler';
import { parseQuery } from '$lib/server/ingest/parse-query';
import { requireApiMember } from '$lib/server/ingest/require-api-member';
import type { RequestHandler } from './$types';

/** The asset's rotation channels as plot series. */
export const GET: RequestHandler = apiHandler(async (event) => {
  const { project } = await requireApiMember(event, event.params.project, 'viewer');
  const query = parseQuery(event.url.searchParams, assetChannelsQuerySchema);
  const build = await getProjectBuild(project.id, event.params.id);
  return json(await getAssetChannels(build.id, event.params.assetId, query));
});

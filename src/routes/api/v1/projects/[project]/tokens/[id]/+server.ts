/** DELETE revokes one API token of a project, for its leads and admins (signed-in session). */
import { json } from '@sveltejs/kit';
import { parseId } from '$lib/server/builds/get-project-build';
import { ApiError } from '$lib/server/ingest/api-error';
import { apiHandler } from '$lib/server/ingest/api-handler';
import { requireApiMember } from '$lib/server/ingest/require-api-member';
import * as apiTokens from '$lib/server/tokens/api-tokens';
import type { RequestHandler } from './$types';

/** Revokes the token. */
export const DELETE: RequestHandler = apiHandler(async (event) => {
  const { project } = await requireApiMember(event, event.params.project, 'lead');
  const tokenId = parseId(event.params.id);
  if (tokenId === null) {
    throw new ApiError(404, 'token.not-found', `This project has no API token "${event.params.id}".`);
  }
  return json({ token: await apiTokens.revoke(project.id, tokenId) });
});

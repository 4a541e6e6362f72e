/** GET one waiver of a project with its state, for signed-in members. */
import { json } from '@sveltejs/kit';
import { parseId } from '$lib/server/builds/get-project-build';
import { apiHandler } from '$lib/server/ingest/api-handler';
import { requireApiMember } from '$lib/server/ingest/require-api-member';
import { findWaiver } from '$lib/server/waivers/list-waivers';
import { WaiverNotFoundError } from '$lib/server/waivers/waiver-errors';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = apiHandler(async (event) => {
  const { project } = await requireApiMember(event, event.params.project, 'viewer');
  const waiverId = parseId(event.params.id);
  const waiver = waiverId === null ? null : await findWaiver(project.id, waiverId);
  if (!waiver) {
    throw new WaiverNotFoundError('waiver.not-found', `${project.name} has no waiver "${event.params.id}".`);
  }
  return json({ waiver });
});

/**
 * Waivers of a project, for signed-in members.
 * - GET: every waiver (newest first, with its state and who proposed and decided it) and the history.
 * - POST `{ scope, fingerprint | rule + assetPath, reason, expiresOn? }`: proposes one (artists and up).
 */
import { json } from '@sveltejs/kit';
import { apiHandler } from '$lib/server/ingest/api-handler';
import { parseJsonBody } from '$lib/server/ingest/parse-json-body';
import { requireApiMember } from '$lib/server/ingest/require-api-member';
import { listWaiverEvents } from '$lib/server/waivers/list-waiver-events';
import { findWaiver, listWaivers } from '$lib/server/waivers/list-waivers';
import { proposeWaiverSchema } from '$lib/server/waivers/waiver-input';
import * as waivers from '$lib/server/waivers/waivers';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = apiHandler(async (event) => {
  const { project } = await requireApiMember(event, event.params.project, 'viewer');
  const [list, events] = await Promise.all([listWaivers(project.id), listWaiverEvents(project.id)]);
  return json({ waivers: list, events });
});

export const POST: RequestHandler = apiHandler(async (event) => {
  const { project, role, user } = await requireApiMember(event, event.params.project, 'artist');
  const input = await parseJsonBody(event.request, proposeWaiverSchema);
  const waiver = await waivers.propose(project, { user, role }, input);
  return json({ waiver: await findWaiver(project.id, waiver.id) }, { status: 201 });
});

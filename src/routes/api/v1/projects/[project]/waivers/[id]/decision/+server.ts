/**
 * POST `{ "action": "approve" | "reject" | "revoke", "note"?: "…" }`: a lead's decision on one waiver.
 * 200 with the waiver as it is now; 409 `waiver.state` when its state does not allow the change.
 */
import { json } from '@sveltejs/kit';
import { parseId } from '$lib/server/builds/get-project-build';
import { apiHandler } from '$lib/server/ingest/api-handler';
import { parseJsonBody } from '$lib/server/ingest/parse-json-body';
import { requireApiMember } from '$lib/server/ingest/require-api-member';
import { findWaiver } from '$lib/server/waivers/list-waivers';
import { WaiverNotFoundError } from '$lib/server/waivers/waiver-errors';
import { waiverDecisionSchema } from '$lib/server/waivers/waiver-input';
import * as waivers from '$lib/server/waivers/waivers';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = apiHandler(async (event) => {
  const { project, role, user } = await requireApiMember(event, event.params.project, 'lead');
  const waiverId = parseId(event.params.id);
  if (waiverId === null) {
    throw new WaiverNotFoundError('waiver.not-found', `${project.name} has no waiver "${event.params.id}".`);
  }
  const decision = await parseJsonBody(event.request, waiverDecisionSchema);
  await waivers.decide(project, { user, role }, waiverId, decision);
  return json({ waiver: await findWaiver(project.id, waiverId) });
});

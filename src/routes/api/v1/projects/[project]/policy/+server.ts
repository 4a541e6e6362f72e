/**
 * The lint policy of a project, for its leads and admins (signed-in session).
 * - GET: the current policy with its revision, version and who saved it (revision 0: the defaults).
 * - PUT `{ "policy": { … } }`: validates it with the policy schema and saves it as the next revision
 *   (nothing is written when it equals the current one). 400 `policy.invalid` names every bad field.
 */
import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { parsePolicy, PolicyError } from '$lib/lint/policy';
import { ApiError } from '$lib/server/ingest/api-error';
import { apiHandler } from '$lib/server/ingest/api-handler';
import { parseJsonBody } from '$lib/server/ingest/parse-json-body';
import { requireApiMember } from '$lib/server/ingest/require-api-member';
import * as policyRevisions from '$lib/server/policies/policy-revisions';
import type { RequestHandler } from './$types';

const putSchema = z.object({ policy: z.record(z.string(), z.unknown()) }).strict();

export const GET: RequestHandler = apiHandler(async (event) => {
  const { project } = await requireApiMember(event, event.params.project, 'lead');
  return json(await policyRevisions.getCurrent(project.id));
});

export const PUT: RequestHandler = apiHandler(async (event) => {
  const { project, user } = await requireApiMember(event, event.params.project, 'lead');
  const body = await parseJsonBody(event.request, putSchema);
  let policy;
  try {
    policy = parsePolicy(body.policy);
  } catch (error) {
    if (error instanceof PolicyError) throw new ApiError(400, error.code, error.message, { cause: error });
    throw error;
  }
  const { current, isUnchanged } = await policyRevisions.save(project.id, policy, user.id);
  return json({ ...current, isUnchanged, policy });
});

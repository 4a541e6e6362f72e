/**
 * API tokens of a project, for its leads and admins (signed-in session).
 * - GET: the tokens (never their secrets).
 * - POST `{ "name": "CI main" }`: a new `submit` token; the answer holds its secret, shown this once.
 */
import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { apiHandler } from '$lib/server/ingest/api-handler';
import { parseJsonBody } from '$lib/server/ingest/parse-json-body';
import { requireApiMember } from '$lib/server/ingest/require-api-member';
import * as apiTokens from '$lib/server/tokens/api-tokens';
import type { RequestHandler } from './$types';

const createTokenSchema = z
  .object({ name: z.string().trim().min(1, 'must not be empty').max(100, 'must be at most 100 characters') })
  .strict();

/** The project's tokens, without secrets. */
export const GET: RequestHandler = apiHandler(async (event) => {
  const { project } = await requireApiMember(event, event.params.project, 'lead');
  return json({ tokens: await apiTokens.list(project.id) });
});

/** Creates a token and shows its secret once. */
export const POST: RequestHandler = apiHandler(async (event) => {
  const { project, user } = await requireApiMember(event, event.params.project, 'lead');
  const { name } = await parseJsonBody(event.request, createTokenSchema);
  const token = await apiTokens.create(project.id, name, user.id);
  return json({ token }, { status: 201, headers: { 'cache-control': 'no-store' } });
});

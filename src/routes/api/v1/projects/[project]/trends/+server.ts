/**
 * GET a project's trend: per build (newest 200 at most, oldest first) its open findings by
 * severity and by rule and the assets it checked, on `branch` (default: the base branch)
 * between `from` and `to`, for signed-in project members.
 */
import { json } from '@sveltejs/kit';
import { listTrend, trendQuerySchema } from '$lib/server/builds/list-trend';
import { apiHandler } from '$lib/server/ingest/api-handler';
import { parseQuery } from '$lib/server/ingest/parse-query';
import { requireApiMember } from '$lib/server/ingest/require-api-member';
import type { RequestHandler } from './$types';

/** The trend of one branch. */
export const GET: RequestHandler = apiHandler(async (event) => {
  const { project } = await requireApiMember(event, event.params.project, 'viewer');
  return json(await listTrend(project, parseQuery(event.url.searchParams, trendQuerySchema)));
});

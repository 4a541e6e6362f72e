import { json } from '@sveltejs/kit';
import { checkHealth } from '$lib/server/health';
import type { RequestHandler } from './$types';

/** Liveness and readiness in one: 200 when the database answers, 503 otherwise. Needs no sign-in. */
export const GET: RequestHandler = async () => {
  const report = await checkHealth();
  return json(report, { status: report.status === 'ok' ? 200 : 503, headers: { 'cache-control': 'no-store' } });
};

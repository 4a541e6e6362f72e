import { base } from '$app/paths';
import type { Trend } from '$lib/server/builds/list-trend';
import type { PageLoad } from './$types';

/** Why the chart series could not be loaded, for the page's error state. */
export interface TrendLoadError {
  status: number;
  code: string;
  message: string;
}

/**
 * The chart series from `GET /api/v1/projects/{project}/trends`, on the server for the first
 * paint and in the browser when the range changes. A failure stays inside the charts' area
 * (the regressions and the controls still show), so it is returned, not thrown.
 */
export const load: PageLoad = async ({ data, fetch, params }) => {
  const search = new URLSearchParams({ branch: data.range.branch });
  if (data.range.from) search.set('from', data.range.from);
  if (data.range.to) search.set('to', data.range.to);
  const url = `${base}/api/v1/projects/${encodeURIComponent(params.project)}/trends?${search}`;
  let trend: Trend | null = null;
  let trendError: TrendLoadError | null = null;
  try {
    const response = await fetch(url, { headers: { accept: 'application/json' } });
    if (response.ok) trend = (await response.json()) as Trend;
    else {
      // A proxy's error page is not JSON; the status line still says what happened.
      const body = (await response.json().catch(() => null)) as { error?: { code?: string; message?: string } } | null;
      trendError = {
        status: response.status,
        code: body?.error?.code ?? `http.${response.status}`,
        message: body?.error?.message ?? `The trend request failed with status ${response.status}.`
      };
    }
  } catch (error) {
    console.debug('Trend request failed', error);
    trendError = { status: 0, code: 'network.failed', message: 'The server could not be reached. Try again.' };
  }
  return { ...data, trend, trendError };
};

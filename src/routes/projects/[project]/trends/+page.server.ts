import { requireProjectRole } from '$lib/server/auth/require-project-role';
import { trendQuerySchema } from '$lib/server/builds/list-trend';
import { listProjectBranches } from '$lib/server/dashboard/list-project-branches';
import { listRegressions } from '$lib/server/regressions/list-regressions';
import type { PageServerLoad } from './$types';
import { DEFAULT_RANGE_DAYS, presetFrom, type TrendRange } from './trend-range';

/**
 * The trends page's range from the URL (a bad one falls back to the default, with a notice), the
 * branches to pick from, and the regressions of that range. The chart series come from the trends
 * API in +page.ts, so the page and CI scripts read the same numbers.
 */
export const load: PageServerLoad = async ({ locals, params, url }) => {
  const { project } = await requireProjectRole(locals, params.project, 'viewer');
  const asked = {
    branch: url.searchParams.get('branch') || project.baseBranch,
    from: url.searchParams.get('from') ?? presetFrom(DEFAULT_RANGE_DAYS),
    to: url.searchParams.get('to') ?? ''
  };
  const parsed = trendQuerySchema.safeParse({
    branch: asked.branch,
    from: asked.from || undefined,
    to: asked.to || undefined
  });
  const isOrdered = !asked.from || !asked.to || asked.from <= asked.to;
  const range: TrendRange =
    parsed.success && isOrdered ? asked : { branch: asked.branch, from: presetFrom(DEFAULT_RANGE_DAYS), to: '' };
  const notice = parsed.success
    ? isOrdered
      ? null
      : `The range ends (${asked.to}) before it starts (${asked.from}); showing the last ${DEFAULT_RANGE_DAYS} days.`
    : `The range in the link is not a pair of dates (YYYY-MM-DD); showing the last ${DEFAULT_RANGE_DAYS} days.`;

  const [branches, regressions] = await Promise.all([
    listProjectBranches(project),
    listRegressions(project, { branch: range.branch, from: range.from || undefined, to: range.to || undefined })
  ]);
  return { range, notice, branches, regressions };
};

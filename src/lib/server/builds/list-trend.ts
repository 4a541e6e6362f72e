/**
 * A project's trend: per build, its open findings by severity and by rule and how many assets
 * it checked, oldest first so charts read left to right.
 */
import { Op, fn, col, type WhereOptions } from 'sequelize';
import { z } from 'zod';
import { Build, FindingRecord } from '../db/models';

/** Most builds one trend answer covers (the newest ones). */
export const TREND_MAX_BUILDS = 200;

/** Query parameters of the trend. */
export const trendQuerySchema = z
  .object({
    /** Branch to follow; the project's base branch when absent. */
    branch: z.string().max(255).optional(),
    /** Earliest build time (ISO 8601 date or date-time), inclusive. */
    from: z.iso
      .date()
      .or(z.iso.datetime({ offset: true }))
      .optional(),
    /** Latest build time (ISO 8601 date or date-time), inclusive; a bare date covers that whole day. */
    to: z.iso
      .date()
      .or(z.iso.datetime({ offset: true }))
      .optional()
  })
  .strict();

/** The parsed trend query. */
export type TrendQuery = z.output<typeof trendQuerySchema>;

/** One build of the trend. */
export interface TrendPointView {
  buildId: number;
  label: string | null;
  commit: string | null;
  createdAt: string;
  verdict: 'pass' | 'fail';
  /** Assets the build checked. */
  assets: number;
  /** Open findings (new or unchanged, not waived) by severity. */
  counts: { error: number; warning: number; info: number };
  /** Open findings by rule id; rules with none are left out. */
  byRule: Record<string, number>;
}

/** The trend of one branch. */
export interface Trend {
  branch: string;
  builds: TrendPointView[];
}

/** The trend of a branch (default the base branch) within an optional time range. */
export async function listTrend(project: { id: number; baseBranch: string }, query: TrendQuery): Promise<Trend> {
  const branch = query.branch ?? project.baseBranch;
  const createdAt: Record<symbol, Date> = {};
  if (query.from) createdAt[Op.gte] = new Date(query.from);
  if (query.to) createdAt[Op.lte] = endOf(query.to);
  const where: WhereOptions<Build> = {
    projectId: project.id,
    branch,
    ...(query.from || query.to ? { createdAt } : {})
  };
  const newest = await Build.findAll({
    where,
    order: [
      ['createdAt', 'DESC'],
      ['id', 'DESC']
    ],
    limit: TREND_MAX_BUILDS
  });
  const builds = newest.reverse();
  const byBuild = await countOpenByRule(builds.map((build) => build.id));
  return {
    branch,
    builds: builds.map((build) => ({
      buildId: build.id,
      label: build.label,
      commit: build.commitSha,
      createdAt: new Date(build.createdAt).toISOString(),
      verdict: build.verdict,
      assets: build.assetCount,
      counts: { error: build.errorCount, warning: build.warningCount, info: build.infoCount },
      byRule: byBuild.get(build.id) ?? {}
    }))
  };
}

/** Open findings per build and rule, in one grouped query. */
async function countOpenByRule(buildIds: number[]): Promise<Map<number, Record<string, number>>> {
  const byBuild = new Map<number, Record<string, number>>();
  if (buildIds.length === 0) return byBuild;
  const rows = (await FindingRecord.findAll({
    attributes: ['buildId', 'rule', [fn('COUNT', col('id')), 'count']],
    where: { buildId: buildIds, status: ['new', 'unchanged'], waived: false },
    group: ['buildId', 'rule'],
    raw: true
  })) as unknown as { buildId: number; rule: string; count: number }[];
  for (const row of rows) {
    const counts = byBuild.get(row.buildId) ?? {};
    counts[row.rule] = Number(row.count);
    byBuild.set(row.buildId, counts);
  }
  return byBuild;
}

/** A bare date means up to the end of that day (UTC); a date-time is taken as given. */
function endOf(value: string): Date {
  return /^\d{4}-\d{2}-\d{2}$/.test(value) ? new Date(`${value}T23:59:59.999Z`) : new Date(value);
}

/**
 * The regression side of a project's trends: how long new errors took to fix on a branch, and
 * which assets regressed most often, within a date range. Reads builds, their assets and their
 * present findings, then leaves the reasoning to find-regressions.ts.
 */
import { Op } from 'sequelize';
import type { TrendQuery } from '../builds/list-trend';
import { Asset, Build, FindingRecord } from '../db/models';
import {
  findRegressions,
  medianTimeToFixMs,
  rankRegressingAssets,
  type BranchBuild,
  type BranchFinding,
  type BuildRef,
  type Regression
} from './find-regressions';

/** Most builds read after the range start: the range itself plus later builds that may fix its regressions. */
export const REGRESSION_MAX_BUILDS = 400;
/** Most regressions listed by time to fix, and most assets ranked. */
export const REGRESSION_LIST_LIMIT = 100;
export const REGRESSING_ASSETS_LIMIT = 20;
/** More distinct asset paths with findings than this are not listed in the assets query (every asset is read instead). */
const MAX_PATHS_IN_QUERY = 50;

/** A build reference for pages and JSON. */
export interface BuildRefView {
  id: number;
  label: string | null;
  createdAt: string;
}

/** One new error finding and how long it stayed. */
export interface RegressionView {
  fingerprint: string;
  rule: string;
  assetPath: string;
  introducedIn: BuildRefView;
  fixedIn: BuildRefView | null;
  timeToFixMs: number | null;
}

/** One row of the "regresses most often" table. */
export interface RegressingAssetView {
  assetPath: string;
  regressionBuilds: number;
  newErrors: number;
  newWarnings: number;
  stillOpen: number;
  rules: string[];
  lastRegressedIn: BuildRefView;
}

/** Time to fix and regressing assets of one branch and range. */
export interface RegressionsView {
  branch: string;
  timeToFix: {
    /** Median over the fixed ones; null when none was fixed. */
    medianMs: number | null;
    fixedCount: number;
    openCount: number;
    /** Newest first, at most {@link REGRESSION_LIST_LIMIT}. */
    items: RegressionView[];
  };
  regressingAssets: RegressingAssetView[];
}

/** Regressions on `query.branch` (default the base branch) introduced between `from` and `to`. */
export async function listRegressions(
  project: { id: number; baseBranch: string },
  query: TrendQuery
): Promise<RegressionsView> {
  const branch = query.branch ?? project.baseBranch;
  const from = query.from ? new Date(query.from) : null;
  const to = query.to ? endOf(query.to) : null;

  // One build before the range tells what was already broken when it starts.
  const before = from
    ? await Build.findOne({
        where: { projectId: project.id, branch, createdAt: { [Op.lt]: from } },
        order: [
          ['createdAt', 'DESC'],
          ['id', 'DESC']
        ]
      })
    : null;
  const rows = await Build.findAll({
    where: { projectId: project.id, branch, ...(from ? { createdAt: { [Op.gte]: from } } : {}) },
    order: [
      ['createdAt', 'ASC'],
      ['id', 'ASC']
    ],
    limit: REGRESSION_MAX_BUILDS
  });
  const builds = before ? [before, ...rows] : rows;
  const branchBuilds = await loadBranchBuilds(builds, (build) => build !== before && (!to || build.createdAt <= to));

  const regressions = findRegressions(branchBuilds);
  const errors = regressions.filter((regression) => regression.severity === 'error');
  const fixedCount = errors.filter((regression) => regression.fixedIn !== null).length;
  return {
    branch,
    timeToFix: {
      medianMs: medianTimeToFixMs(errors),
      fixedCount,
      openCount: errors.length - fixedCount,
      items: errors.slice(-REGRESSION_LIST_LIMIT).reverse().map(toRegressionView)
    },
    regressingAssets: rankRegressingAssets(regressions)
      .slice(0, REGRESSING_ASSETS_LIMIT)
      .map((row) => ({
        assetPath: row.assetPath,
        regressionBuilds: row.regressionBuilds,
        newErrors: row.newErrors,
        newWarnings: row.newWarnings,
        stillOpen: row.stillOpen,
        rules: row.rules,
        lastRegressedIn: toRefView(row.lastRegressedIn)
      }))
  };
}

async function loadBranchBuilds(builds: Build[], isInRange: (build: Build) => boolean): Promise<BranchBuild[]> {
  const ids = builds.map((build) => build.id);
  if (ids.length === 0) return [];
  const findings = (await FindingRecord.findAll({
    attributes: ['buildId', 'fingerprint', 'rule', 'severity', 'assetPath', 'status'],
    where: { buildId: { [Op.in]: ids }, status: { [Op.in]: ['new', 'unchanged'] }, severity: ['error', 'warning'] },
    order: [['id', 'ASC']],
    raw: true
  })) as unknown as (BranchFinding & { buildId: number })[];
  // Whether a build checked an asset only matters for assets that had findings (find-regressions.ts
  // asks it to tell a fix from an asset left out), so when few assets had any, only theirs are read.
  // Reading every asset (400 builds × 200 assets in bench/queries.bench.ts) took about 65 ms of the
  // trends page; listing many paths made SQLite probe each pair and measured slower than that.
  const findingPaths = [...new Set(findings.map((finding) => finding.assetPath))];
  const assets = (await Asset.findAll({
    attributes: ['buildId', 'path'],
    where: {
      buildId: { [Op.in]: ids },
      ...(findingPaths.length <= MAX_PATHS_IN_QUERY ? { path: { [Op.in]: findingPaths } } : {})
    },
    raw: true
  })) as unknown as { buildId: number; path: string }[];

  const findingsByBuild = groupBy(findings, (finding) => finding.buildId);
  const assetsByBuild = groupBy(assets, (asset) => asset.buildId);
  return builds.map((build) => ({
    id: build.id,
    label: build.label,
    createdAt: new Date(build.createdAt),
    checkedAssets: new Set((assetsByBuild.get(build.id) ?? []).map((asset) => asset.path)),
    findings: findingsByBuild.get(build.id) ?? [],
    isInRange: isInRange(build)
  }));
}

function groupBy<T>(items: readonly T[], keyOf: (item: T) => number): Map<number, T[]> {
  const groups = new Map<number, T[]>();
  for (const item of items) {
    const key = keyOf(item);
    const group = groups.get(key);
    if (group) group.push(item);
    else groups.set(key, [item]);
  }
  return groups;
}

function toRegressionView(regression: Regression): RegressionView {
  return {
    fingerprint: regression.fingerprint,
    rule: regression.rule,
    assetPath: regression.assetPath,
    introducedIn: toRefView(regression.introducedIn),
    fixedIn: regression.fixedIn ? toRefView(regression.fixedIn) : null,
    timeToFixMs: regression.timeToFixMs
  };
}

function toRefView(build: BuildRef): BuildRefView {
  return { id: build.id, label: build.label, createdAt: build.createdAt.toISOString() };
}

/** A bare date means up to the end of that day (UTC), as in the trend. */
function endOf(value: string): Date {
  return /^\d{4}-\d{2}-\d{2}$/.test(value) ? new Date(`${value}T23:59:59.999Z`) : new Date(value);
}

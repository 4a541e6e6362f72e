/**
 * What the home page shows for each project the signed-in user can see: the page's data
 * contract between `src/routes/+page.server.ts` and `+page.svelte`. Dates are ISO 8601 strings.
 */

/** The most recent build of a project on any branch. */
export interface LatestBuildSummary {
  id: number;
  verdict: 'pass' | 'fail';
  label: string | null;
  branch: string;
  commitSha: string | null;
  createdAt: string;
}

/** Open findings (new or unchanged, not waived) by severity in one build. */
export interface SeverityCountsSummary {
  error: number;
  warning: number;
  info: number;
}

/** One point of the base-branch trend line. */
export interface TrendPoint extends SeverityCountsSummary {
  buildId: number;
  createdAt: string;
}

export interface ProjectOverview {
  slug: string;
  name: string;
  baseBranch: string;
  /** Latest build on any branch; null before the first build. */
  latest: LatestBuildSummary | null;
  /** Open findings of the latest base-branch build (zeros before the first one). */
  open: SeverityCountsSummary;
  /** The last 20 base-branch builds, oldest first. */
  trend: TrendPoint[];
  /** When the latest build (any branch) arrived; null before the first build. */
  lastBuildAt: string | null;
}

/** Data returned by the home page's `load`. */
export interface HomePageData {
  projects: ProjectOverview[];
}

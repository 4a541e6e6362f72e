/**
 * The API's view of a build: what `POST .../builds` answers and what the build list and
 * detail routes start from. Dates are ISO 8601 strings.
 */
import type { Build } from '../db/models';

/** Counts as the API shows them (see BuildCounts in ingest/plan-build.ts for their meaning). */
export interface BuildCountsView {
  error: number;
  warning: number;
  info: number;
  new: number;
  unchanged: number;
  fixed: number;
  waived: number;
}

/** A build as the API shows it. */
export interface BuildSummary {
  id: number;
  branch: string;
  commit: string | null;
  label: string | null;
  ciJobUrl: string | null;
  verdict: 'pass' | 'fail';
  verdictReason: string | null;
  counts: BuildCountsView;
  assetCount: number;
  baselineBuildId: number | null;
  policyVersion: string;
  engineVersion: string;
  durationMs: number | null;
  createdAt: string;
  /** Absolute URL of the build's report page in the web app. */
  reportUrl: string;
}

/** Path of a build's report page in the web app. */
export function reportPathOf(projectSlug: string, buildId: number): string {
  return `/projects/${encodeURIComponent(projectSlug)}/builds/${buildId}`;
}

/** The API view of a stored build; `origin` is the server's public origin, e.g. `https://orientry.example`. */
export function summarizeBuild(build: Build, projectSlug: string, origin: string): BuildSummary {
  return {
    id: build.id,
    branch: build.branch,
    commit: build.commitSha,
    label: build.label,
    ciJobUrl: build.ciJobUrl,
    verdict: build.verdict,
    verdictReason: build.verdictReason,
    counts: {
      error: build.errorCount,
      warning: build.warningCount,
      info: build.infoCount,
      new: build.newCount,
      unchanged: build.unchangedCount,
      fixed: build.fixedCount,
      waived: build.waivedCount
    },
    assetCount: build.assetCount,
    baselineBuildId: build.baselineBuildId,
    policyVersion: build.policyVersion,
    engineVersion: build.engineVersion,
    durationMs: build.durationMs,
    createdAt: new Date(build.createdAt).toISOString(),
    reportUrl: origin + reportPathOf(projectSlug, build.id)
  };
}

/**
 * The few lines `submit` prints on stdout for a stored build: the gate's verdict and reason,
 * the finding counts, how the build compares with its baseline, and the report's address, so
 * a CI log says what happened without opening the report.
 */
import type { BuildAnswer } from './post-build';
import { plural } from './plural';

/** What the summary says besides the build itself. */
export interface BuildSummaryContext {
  project: string;
  /** The server already had this build (a repeated idempotency key). */
  isExisting: boolean;
}

/**
 * The summary text, ending with a newline.
 * @example
 *   orientry: build 12 of tidewatch: gate FAILED
 *     feature/lantern-arm at 3f2a9c1d0e5b (#1483), 2 assets
 *     reason: 1 new error: hemisphere-jump in chars/keeper.glb (/Keeper/LanternArm at 0.5 s)
 *     open findings: 1 error, 0 warnings, 0 info
 *     against build 11: 1 new, 0 unchanged, 0 fixed, 0 waived
 *     report: https://orientry.example/projects/tidewatch/builds/12
 */
export function formatBuildSummary(build: BuildAnswer, context: BuildSummaryContext): string {
  const { counts } = build;
  const origin = [
    build.branch,
    build.commit ? `at ${build.commit.slice(0, 12)}` : null,
    build.label ? `(${build.label})` : null
  ].filter((part) => part !== null);
  const comparison =
    build.baselineBuildId === null
      ? 'no baseline build yet: every finding counts as new'
      : `against build ${build.baselineBuildId}: ${counts.new} new, ${counts.unchanged} unchanged, ${counts.fixed} fixed, ${counts.waived} waived`;
  const lines = [
    `orientry: build ${build.id} of ${context.project}: gate ${build.verdict === 'pass' ? 'passed' : 'FAILED'}`,
    `  ${origin.join(' ')}, ${plural(build.assetCount, 'asset')}`,
    ...(build.verdictReason ? [`  reason: ${build.verdictReason}`] : []),
    `  open findings: ${plural(counts.error, 'error')}, ${plural(counts.warning, 'warning')}, ${counts.info} info`,
    `  ${comparison}`,
    ...(context.isExisting
      ? ['  already submitted with this idempotency key: this is the stored build, not a new one']
      : []),
    `  report: ${build.reportUrl}`
  ];
  return lines.join('\n') + '\n';
}

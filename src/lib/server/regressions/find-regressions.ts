/**
 * Regressions on one branch: when a finding first appeared and when it went away again. Pure, so
 * the trends' time-to-fix and "assets that regress most" are tested without a database.
 *
 * Design notes: a finding is "introduced" by the build where it is `new` (absent from the baseline)
 * and was not already present in the branch's previous build; it is "fixed" by the first later build
 * on the same branch that checked its asset and no longer has its fingerprint. Presence, not the
 * stored `fixed` rows, decides: builds are compared with the base branch, so on a feature branch a
 * defect the base branch never had gets no `fixed` row when it goes away. A build that left the asset
 * out says nothing, as in compare-with-baseline.ts. Waived findings are still present: a waiver
 * accepts a defect, it does not fix it.
 */

/** The severities a regression is tracked for; info findings are notes, not regressions. */
export type TrackedSeverity = 'error' | 'warning';

/** One stored finding of a build, as much as the analysis needs. */
export interface BranchFinding {
  fingerprint: string;
  rule: string;
  severity: TrackedSeverity;
  assetPath: string;
  status: 'new' | 'unchanged';
}

/** One build of the branch, oldest first in the input. */
export interface BranchBuild {
  id: number;
  label: string | null;
  createdAt: Date;
  /** Paths of the assets the build checked. */
  checkedAssets: ReadonlySet<string>;
  /** Its present findings (new or unchanged) at tracked severities. */
  findings: readonly BranchFinding[];
  /** False for builds before the chosen range: they only tell what was already there. */
  isInRange: boolean;
}

/** A build as a regression names it. */
export interface BuildRef {
  id: number;
  label: string | null;
  createdAt: Date;
}

/** A finding that appeared in one build and (perhaps) went away in a later one. */
export interface Regression {
  fingerprint: string;
  rule: string;
  severity: TrackedSeverity;
  assetPath: string;
  introducedIn: BuildRef;
  /** The first later build without it, or null while it is still there. */
  fixedIn: BuildRef | null;
  /** Time from the introducing build to the fixing one; null while open. */
  timeToFixMs: number | null;
}

/** Every regression introduced in the in-range builds, in the order they appeared. */
export function findRegressions(builds: readonly BranchBuild[]): Regression[] {
  const regressions: Regression[] = [];
  // Fingerprints believed present, with their regression when one is being tracked.
  const alive = new Map<string, { assetPath: string; regression: Regression | null }>();
  for (const build of builds) {
    const current = new Map<string, BranchFinding>();
    for (const finding of build.findings)
      if (!current.has(finding.fingerprint)) current.set(finding.fingerprint, finding);

    for (const [fingerprint, entry] of alive) {
      if (current.has(fingerprint) || !build.checkedAssets.has(entry.assetPath)) continue;
      alive.delete(fingerprint);
      if (entry.regression) {
        entry.regression.fixedIn = refOf(build);
        entry.regression.timeToFixMs = build.createdAt.getTime() - entry.regression.introducedIn.createdAt.getTime();
      }
    }
    for (const [fingerprint, finding] of current) {
      if (alive.has(fingerprint)) continue;
      const regression =
        build.isInRange && finding.status === 'new'
          ? {
              fingerprint,
              rule: finding.rule,
              severity: finding.severity,
              assetPath: finding.assetPath,
              introducedIn: refOf(build),
              fixedIn: null,
              timeToFixMs: null
            }
          : null;
      if (regression) regressions.push(regression);
      alive.set(fingerprint, { assetPath: finding.assetPath, regression });
    }
  }
  return regressions;
}

/** The median of the fixed regressions' times to fix, or null when none was fixed. */
export function medianTimeToFixMs(regressions: readonly Regression[]): number | null {
  const times = regressions
    .map((regression) => regression.timeToFixMs)
    .filter((time): time is number => time !== null)
    .sort((a, b) => a - b);
  if (times.length === 0) return null;
  const middle = Math.floor(times.length / 2);
  return times.length % 2 === 1 ? times[middle] : (times[middle - 1] + times[middle]) / 2;
}

/** One asset's regression record over the range. */
export interface RegressingAsset {
  assetPath: string;
  /** Builds that introduced at least one finding in this asset. */
  regressionBuilds: number;
  newErrors: number;
  newWarnings: number;
  /** Of those findings, how many are still present in the branch's latest build. */
  stillOpen: number;
  rules: string[];
  lastRegressedAt: Date;
  lastRegressedIn: BuildRef;
}

/** Assets by how often they regressed (most first; ties by new errors, then path). */
export function rankRegressingAssets(regressions: readonly Regression[]): RegressingAsset[] {
  const byAsset = new Map<string, { builds: Set<number>; rules: Set<string>; row: RegressingAsset }>();
  for (const regression of regressions) {
    let entry = byAsset.get(regression.assetPath);
    if (!entry) {
      entry = {
        builds: new Set(),
        rules: new Set(),
        row: {
          assetPath: regression.assetPath,
          regressionBuilds: 0,
          newErrors: 0,
          newWarnings: 0,
          stillOpen: 0,
          rules: [],
          lastRegressedAt: regression.introducedIn.createdAt,
          lastRegressedIn: regression.introducedIn
        }
      };
      byAsset.set(regression.assetPath, entry);
    }
    entry.builds.add(regression.introducedIn.id);
    entry.rules.add(regression.rule);
    if (regression.severity === 'error') entry.row.newErrors++;
    else entry.row.newWarnings++;
    if (regression.fixedIn === null) entry.row.stillOpen++;
    if (regression.introducedIn.createdAt.getTime() >= entry.row.lastRegressedAt.getTime()) {
      entry.row.lastRegressedAt = regression.introducedIn.createdAt;
      entry.row.lastRegressedIn = regression.introducedIn;
    }
  }
  return [...byAsset.values()]
    .map(({ builds, rules, row }) => ({ ...row, regressionBuilds: builds.size, rules: [...rules].sort() }))
    .sort(
      (a, b) =>
        b.regressionBuilds - a.regressionBuilds || b.newErrors - a.newErrors || a.assetPath.localeCompare(b.assetPath)
    );
}

function refOf(build: BranchBuild): BuildRef {
  return { id: build.id, label: build.label, createdAt: build.createdAt };
}

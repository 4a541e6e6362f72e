/**
 * Everything a new build will store, worked out before the write transaction opens: each
 * finding's standing against the baseline, its waiver, the per-asset and per-build counts, and
 * the verdict. Pure, so the whole decision is tested without a database, and the transaction
 * only writes what is already decided.
 */
import { SEVERITY_RANK, type Finding, type Severity } from '../../lint/finding';
import type { AssetReport } from '../../lint/lint-report';
import type { Policy } from '../../lint/policy';
import { compareWithBaseline, type BaselineStatus, type ComparableFinding } from './compare-with-baseline';
import { decideVerdict, type VerdictDecision } from './decide-verdict';
import { findWaiver, type WaiverTerms } from './find-waiver';

/** Counts stored on a build and answered to CI. */
export interface BuildCounts {
  /** Open findings (new or unchanged, not waived) by severity. */
  error: number;
  warning: number;
  info: number;
  /** Open findings absent from the baseline. */
  new: number;
  /** Open findings the baseline had too. */
  unchanged: number;
  /** Baseline findings now gone. */
  fixed: number;
  /** Present findings an approved waiver covers. */
  waived: number;
}

/** One finding as it will be stored. */
export interface PlannedFinding {
  finding: Finding;
  status: BaselineStatus;
  waiverId: number | null;
}

/** One checked asset as it will be stored. */
export interface PlannedAsset {
  report: AssetReport;
  /** Its present findings (new and unchanged) and the baseline's findings on it that are gone (fixed). */
  findings: PlannedFinding[];
  /** Open findings by severity. */
  counts: Record<Severity, number>;
  /** Rule of the heaviest open finding; null when none is open. */
  worstRule: string | null;
}

/** The whole build, decided. */
export interface BuildPlan {
  assets: PlannedAsset[];
  counts: BuildCounts;
  decision: VerdictDecision;
}

/** The baseline build's present findings (what comparing needs of each), and the whole finding of one that is fixed. */
export interface PlanBaseline<B extends ComparableFinding> {
  findings: readonly B[];
  /** Only called for the findings {@link fixedBaselineFindings} names. */
  fixedFinding: (finding: B) => Finding;
}

/**
 * Plans a build from its checked assets' reports (skipped ones left out), the baseline build's
 * present findings (null without a baseline) and the project's waivers.
 */
export function planBuild<B extends ComparableFinding>(
  reports: readonly AssetReport[],
  baseline: PlanBaseline<B> | null,
  waivers: readonly WaiverTerms[],
  policy: Policy,
  now: Date
): BuildPlan {
  const compared = compareReports(reports, baseline?.findings ?? null).map(({ finding, status }) => ({
    finding: status === 'fixed' ? baseline!.fixedFinding(finding as B) : (finding as Finding),
    status
  }));

  const counts: BuildCounts = { error: 0, warning: 0, info: 0, new: 0, unchanged: 0, fixed: 0, waived: 0 };
  const byAsset = new Map<string, PlannedFinding[]>(reports.map((report) => [report.path, []]));
  const gateInput = compared.map(({ finding, status }) => {
    // A fixed finding is history: no waiver applies to what is gone.
    const waiver = status === 'fixed' ? null : findWaiver(finding, waivers, now);
    byAsset.get(finding.asset)!.push({ finding, status, waiverId: waiver?.id ?? null });
    if (status === 'fixed') counts.fixed++;
    else if (waiver) counts.waived++;
    else {
      counts[finding.severity]++;
      counts[status]++;
    }
    return { ...finding, status, isWaived: waiver !== null };
  });

  const assets = reports.map((report) => {
    const findings = byAsset.get(report.path)!;
    const open = findings.filter((planned) => planned.status !== 'fixed' && planned.waiverId === null);
    const assetCounts: Record<Severity, number> = { error: 0, warning: 0, info: 0 };
    let worst: Finding | null = null;
    for (const { finding } of open) {
      assetCounts[finding.severity]++;
      if (!worst || SEVERITY_RANK[finding.severity] > SEVERITY_RANK[worst.severity]) worst = finding;
    }
    return { report, findings, counts: assetCounts, worstRule: worst?.rule ?? null };
  });

  return { assets, counts, decision: decideVerdict(gateInput, policy.gate) };
}

/**
 * The baseline's findings that the build fixes: the ones {@link planBuild} will need whole, so
 * the caller can read just those (a baseline is read with only what comparing needs).
 */
export function fixedBaselineFindings<B extends ComparableFinding>(
  reports: readonly AssetReport[],
  baselineFindings: readonly B[]
): B[] {
  return compareReports(reports, baselineFindings)
    .filter(({ status }) => status === 'fixed')
    .map(({ finding }) => finding as B);
}

function compareReports<B extends ComparableFinding>(reports: readonly AssetReport[], baseline: readonly B[] | null) {
  const current: (Finding | B)[] = reports.flatMap((report) => report.findings);
  return compareWithBaseline(current, baseline, new Set(reports.map((report) => report.path)));
}

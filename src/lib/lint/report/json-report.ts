/**
 * Orientry's own JSON report: the whole LintReport, pretty printed with a fixed key order.
 * It is the format the CLI uploads and the server stores, so it is versioned (`schema`,
 * `schemaVersion`) and documented field by field in docs/report-format.md.
 */
import type { AssetReport, LintReport } from '../lint-report';
import type { Finding, FindingValues } from '../finding';

/**
 * Serialises a report as Orientry's versioned JSON format (2-space indent, trailing newline).
 * Keys always come out in the documented order and `values` keys sorted, so two equal reports
 * give byte-identical text (diffs and hashes of reports stay meaningful).
 * Numbers that JSON cannot hold (NaN, ±Infinity) are written as null.
 *
 * @example toJsonReport(report) // → '{\n  "schema": "orientry.lint-report",\n  "schemaVersion": 1, ...'
 */
export function toJsonReport(report: LintReport): string {
  const ordered = {
    schema: report.schema,
    schemaVersion: report.schemaVersion,
    tool: { name: report.tool.name, version: report.tool.version },
    policyVersion: report.policyVersion,
    summary: {
      assets: report.summary.assets,
      findings: report.summary.findings,
      error: report.summary.error,
      warning: report.summary.warning,
      info: report.summary.info
    },
    assets: report.assets.map(orderAsset)
  };
  return `${JSON.stringify(ordered, null, 2)}\n`;
}

function orderAsset(asset: AssetReport) {
  return {
    path: asset.path,
    byteLength: asset.byteLength,
    unreadable: asset.unreadable,
    skipped: asset.skipped,
    stats: {
      animations: asset.stats.animations,
      rotationChannels: asset.stats.rotationChannels,
      rotationKeys: asset.stats.rotationKeys,
      nodesWithRotation: asset.stats.nodesWithRotation
    },
    findings: asset.findings.map(orderFinding)
  };
}

function orderFinding(finding: Finding) {
  return {
    rule: finding.rule,
    severity: finding.severity,
    asset: finding.asset,
    animation: finding.animation,
    channel: finding.channel,
    node: finding.node,
    keys: finding.keys ? [finding.keys[0], finding.keys[1]] : null,
    time: finding.time,
    values: sortedValues(finding.values),
    message: finding.message,
    hint: finding.hint,
    fingerprint: finding.fingerprint
  };
}

/** The rule-specific values with keys sorted by code unit, so the text does not depend on insertion order. */
function sortedValues(values: FindingValues): FindingValues {
  const sorted: FindingValues = {};
  for (const key of Object.keys(values).sort(compareCodeUnits)) sorted[key] = values[key];
  return sorted;
}

function compareCodeUnits(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

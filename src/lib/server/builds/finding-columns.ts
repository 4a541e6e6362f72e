/**
 * Conversion between the lint library's {@link Finding} and the columns of a stored finding
 * row. Ingestion writes with it; reports, reuse and baselines read with it.
 */
import type { Finding, FindingValues } from '../../lint/finding';
import type { FindingRecord } from '../db/models';

/** The columns of a finding row that describe the finding itself (not its build or standing). */
export interface FindingColumns {
  assetPath: string;
  rule: string;
  severity: Finding['severity'];
  animation: string | null;
  channel: number | null;
  node: string | null;
  keyFirst: number | null;
  keyLast: number | null;
  timeSeconds: number | null;
  valuesJson: string | null;
  message: string;
  hint: string;
  fingerprint: string;
}

/** The row columns of a finding. */
export function findingColumnsOf(finding: Finding): FindingColumns {
  return {
    assetPath: finding.asset,
    rule: finding.rule,
    severity: finding.severity,
    animation: finding.animation,
    channel: finding.channel,
    node: finding.node,
    keyFirst: finding.keys?.[0] ?? null,
    keyLast: finding.keys?.[1] ?? null,
    timeSeconds: finding.time,
    valuesJson: Object.keys(finding.values).length === 0 ? null : JSON.stringify(finding.values),
    message: finding.message,
    hint: finding.hint,
    fingerprint: finding.fingerprint
  };
}

/** The finding a stored row holds. */
export function findingOf(row: FindingColumns | FindingRecord): Finding {
  return {
    rule: row.rule,
    severity: row.severity,
    asset: row.assetPath,
    animation: row.animation,
    channel: row.channel,
    node: row.node,
    keys: row.keyFirst === null ? null : [row.keyFirst, row.keyLast ?? row.keyFirst],
    time: row.timeSeconds,
    values: row.valuesJson ? (JSON.parse(row.valuesJson) as FindingValues) : {},
    message: row.message,
    hint: row.hint,
    fingerprint: row.fingerprint
  };
}

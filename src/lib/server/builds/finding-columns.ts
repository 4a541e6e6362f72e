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

/** The columns {@link findingOf} reads, for queries that fetch plain rows (`raw: true`). */
export const FINDING_COLUMN_NAMES: readonly (keyof FindingColumns)[] = [
  'assetPath',
  'rule',
  'severity',
  'animation',
  'channel',
  'node',
  'keyFirst',
  'keyLast',
  'timeSeconds',
  'valuesJson',
  'message',
  'hint',
  'fingerprint'
];

/**
 * The row columns of a finding. Names come from the uploaded file and may hold NUL, which neither
 * SQLite's inline INSERT text nor PostgreSQL text can carry: it is stored as U+FFFD, the Unicode
 * replacement character.
 */
export function findingColumnsOf(finding: Finding): FindingColumns {
  return {
    assetPath: finding.asset,
    rule: finding.rule,
    severity: finding.severity,
    animation: storable(finding.animation),
    channel: finding.channel,
    node: storable(finding.node),
    keyFirst: finding.keys?.[0] ?? null,
    keyLast: finding.keys?.[1] ?? null,
    timeSeconds: finding.time,
    valuesJson: Object.keys(finding.values).length === 0 ? null : JSON.stringify(finding.values),
    message: storable(finding.message),
    hint: storable(finding.hint),
    fingerprint: finding.fingerprint
  };
}

/** The values of {@link findingColumnsOf} in {@link FINDING_COLUMN_NAMES} order, for multi-row INSERTs. */
export function findingValuesOf(finding: Finding): FindingColumns[keyof FindingColumns][] {
  const columns = findingColumnsOf(finding);
  return FINDING_COLUMN_NAMES.map((name) => columns[name]);
}

function storable<T extends string | null>(text: T): T {
  return (text === null ? null : text.replaceAll('\u0000', '\ufffd')) as T;
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

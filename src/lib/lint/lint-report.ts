/**
 * The result of linting one or more assets: what every report format (JSON, SARIF, JUnit,
 * text) and the server's storage are built from.
 */
import type { Finding, Severity } from './finding';

/** Counts of what was examined in one asset, for reports and trends. */
export interface AssetStats {
  animations: number;
  rotationChannels: number;
  rotationKeys: number;
  /** Nodes carrying a static `rotation`. */
  nodesWithRotation: number;
}

export interface AssetReport {
  /** Path as submitted. */
  path: string;
  byteLength: number;
  /** True when the file could not be read: its findings then hold one `asset-unreadable` error. */
  unreadable: boolean;
  /** True when policy include/exclude globs skipped the asset (it has no findings). */
  skipped: boolean;
  stats: AssetStats;
  findings: Finding[];
}

export type SeverityCounts = Record<Severity, number>;

export interface LintReport {
  /** Identifies our own versioned JSON format (documented in README). */
  schema: 'orientry.lint-report';
  schemaVersion: 1;
  tool: { name: 'orientry'; version: string };
  /** Content hash of the policy the assets were linted under. */
  policyVersion: string;
  assets: AssetReport[];
  summary: SeverityCounts & { assets: number; findings: number };
}

/** Counts findings by severity. */
export function countBySeverity(findings: readonly Finding[]): SeverityCounts {
  const counts: SeverityCounts = { error: 0, warning: 0, info: 0 };
  for (const finding of findings) counts[finding.severity]++;
  return counts;
}

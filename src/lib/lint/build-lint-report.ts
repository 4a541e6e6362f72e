/**
 * Assembles per-asset results into the {@link LintReport} every report format and the server's
 * storage are built from.
 */
import { countBySeverity, type AssetReport, type LintReport } from './lint-report';
import { policyVersionOf, type Policy } from './policy';
import { ENGINE_VERSION } from './version';

/** A lint report over `assets` (kept in the given order) linted under `policy`. */
export function buildLintReport(assets: AssetReport[], policy: Policy): LintReport {
  const findings = assets.flatMap((asset) => asset.findings);
  return {
    schema: 'orientry.lint-report',
    schemaVersion: 1,
    tool: { name: 'orientry', version: ENGINE_VERSION },
    policyVersion: policyVersionOf(policy),
    assets,
    summary: { ...countBySeverity(findings), assets: assets.length, findings: findings.length }
  };
}

/**
 * The report for a main file the CLI could not even open (no permission, a read error). The lint
 * library reports files it cannot parse; this covers the step before it, in the same shape: one
 * `asset-unreadable` finding, so the gate fails and the other files are still linted.
 */
import { fingerprintOf, severityFor, type AssetReport, type Finding, type Policy } from '$lib/lint';

const RULE = 'asset-unreadable';

/**
 * An AssetReport holding one `asset-unreadable` finding for `path`, explaining `error`. Like the
 * library's, its severity follows the policy (which may lower or silence the rule).
 */
export function unreadableAssetReport(path: string, error: unknown, policy: Policy): AssetReport {
  const severity = severityFor(policy, RULE, 'error');
  return {
    path,
    byteLength: 0,
    unreadable: true,
    skipped: false,
    stats: { animations: 0, rotationChannels: 0, rotationKeys: 0, nodesWithRotation: 0 },
    findings: severity === 'off' ? [] : [unreadableFinding(path, error, severity)]
  };
}

function unreadableFinding(path: string, error: unknown, severity: Finding['severity']): Finding {
  const code = (error as { code?: unknown } | null)?.code;
  const reason = typeof code === 'string' ? code : error instanceof Error ? error.message : String(error);
  return {
    rule: RULE,
    severity,
    asset: path,
    animation: null,
    channel: null,
    node: null,
    keys: null,
    time: null,
    values: { code: 'asset.file-unreadable', reason },
    message: `${path}: the file could not be opened for reading (${reason}).`,
    hint: 'Check that the file exists, is a regular file and is readable by the user running the check.',
    // Same identity as the library's unreadable finding: the cause is not part of it.
    fingerprint: fingerprintOf({ rule: RULE, asset: path, animation: null, node: null })
  };
}

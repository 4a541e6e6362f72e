/**
 * Lints one asset from its bytes. The entry point the CLI, the server and the browser share:
 * a file that cannot be read never throws, it becomes one `asset-unreadable` finding, so the
 * rest of a build still gets linted.
 */
import { isAssetReadError, type AssetReadError } from './asset-read-error';
import { isAssetIncluded } from './asset-filter';
import type { AssetSource } from './asset-source';
import { fingerprintOf, type Finding } from './finding';
import type { AssetReport, AssetStats } from './lint-report';
import { lintDocument } from './lint-document';
import { severityFor, type Policy } from './policy';
import { readAsset, type ReadOptions } from './read/read-asset-document';

const NO_STATS: AssetStats = { animations: 0, rotationChannels: 0, rotationKeys: 0, nodesWithRotation: 0 };

/**
 * Reads and lints one asset under `policy`. Assets outside the policy's include/exclude globs come
 * back `skipped` with no findings. Errors that are not about the file (a bug in a rule) propagate.
 */
export async function lintAsset(source: AssetSource, policy: Policy, options?: ReadOptions): Promise<AssetReport> {
  if (!isAssetIncluded(source.path, policy)) {
    return {
      path: source.path,
      byteLength: source.bytes.byteLength,
      unreadable: false,
      skipped: true,
      stats: { ...NO_STATS },
      findings: []
    };
  }
  let read: Awaited<ReturnType<typeof readAsset>>;
  try {
    // The Document is only read from here, so its keyframes may view the file's own bytes.
    read = await readAsset(source, { ...options, viewKeyframes: true });
  } catch (error) {
    if (!isAssetReadError(error)) throw error;
    const severity = severityFor(policy, 'asset-unreadable', 'error');
    return {
      path: source.path,
      byteLength: source.bytes.byteLength,
      unreadable: true,
      skipped: false,
      stats: { ...NO_STATS },
      // A policy may lower or silence the rule; the asset is still marked unreadable.
      findings: severity === 'off' ? [] : [unreadableFinding(source.path, error, severity)]
    };
  }
  const { findings, stats } = lintDocument(read.document, source.path, policy);
  return { path: source.path, byteLength: read.byteLength, unreadable: false, skipped: false, stats, findings };
}

/** The one finding an unreadable asset gets: the reader's message and hint, its code in `values`. */
function unreadableFinding(asset: string, error: AssetReadError, severity: Finding['severity']): Finding {
  return {
    rule: 'asset-unreadable',
    severity,
    asset,
    animation: null,
    channel: null,
    node: null,
    keys: null,
    time: null,
    values: { code: error.code },
    message: error.message,
    hint: error.hint,
    // No reason in the fingerprint: "this asset cannot be read" stays one identity across causes.
    fingerprint: fingerprintOf({ rule: 'asset-unreadable', asset, animation: null, node: null })
  };
}

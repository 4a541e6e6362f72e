/**
 * Reuse of an earlier lint: an asset whose bytes, side files, policy version and engine version
 * all match an asset stored before gets that asset's findings instead of being linted again.
 *
 * Design notes: the main file's hash alone is not enough for a `.gltf` (or a `.glb` with external
 * buffers): the same JSON over a different `.bin` animates differently. So a stored asset is
 * reused only when every side file it read resolves, from the new asset's folder, to a file of
 * this upload with the same hash (or is still missing when it was missing). When the asset moved
 * to another path its findings are re-stamped with the new path, and their fingerprints (which
 * include the path) recomputed with `fingerprintOf`. A stored row does not keep the fingerprint's
 * `target` discriminator, so it is recovered by trying the targets the rules use and checking the
 * result against the stored fingerprint; a row that cannot be recovered means a fresh lint.
 */
import path from 'node:path';
import { fingerprintOf, type Finding } from '../../lint/finding';
import type { AssetReport, AssetStats } from '../../lint/lint-report';
import { ENGINE_VERSION } from '../../lint/version';
import { findStandingFindings } from '../builds/find-standing-findings';
import { Asset, Build } from '../db/models';
import { assetSideFiles } from './asset-side-file';
import type { SideFileDigests } from './side-file-reader';

/** A lint result taken over from a stored asset. */
export interface ReusedLint {
  report: AssetReport;
  sideFiles: SideFileDigests;
  /** The stored asset the findings came from. */
  sourceAssetId: number;
}

/** How many stored twins are considered before giving up and linting. */
const CANDIDATE_LIMIT = 10;

/**
 * Finds a stored lint of the same content under the same policy and engine version.
 * @param digestOf the SHA-256 of a file of this upload by its upload-relative path.
 */
export async function findReusableLint(
  asset: { path: string; sha256: string },
  policyVersion: string,
  digestOf: (uploadPath: string) => string | undefined
): Promise<ReusedLint | null> {
  const candidates = await Asset.findAll({
    where: { contentHash: asset.sha256, policyVersion },
    include: [{ model: Build, as: 'build', attributes: [], where: { engineVersion: ENGINE_VERSION }, required: true }],
    order: [['id', 'DESC']],
    limit: CANDIDATE_LIMIT
  });
  // A twin at the same path needs no re-stamping, so it is tried first.
  candidates.sort((a, b) => Number(b.path === asset.path) - Number(a.path === asset.path));

  for (const candidate of candidates) {
    const sideFiles = await sideFilesMatching(candidate.id, asset.path, digestOf);
    if (sideFiles === null) continue;
    const findings = restamp(await findStandingFindings({ assetId: candidate.id }), candidate.path, asset.path);
    if (findings === null) continue;
    return {
      report: {
        path: asset.path,
        byteLength: candidate.byteLength,
        unreadable: candidate.unreadable,
        skipped: false,
        stats: JSON.parse(candidate.statsJson ?? 'null') ?? emptyStats(),
        findings
      },
      sideFiles,
      sourceAssetId: candidate.id
    };
  }
  return null;
}

/** The stored asset's side files when they all match this upload, else null. */
async function sideFilesMatching(
  assetId: number,
  assetPath: string,
  digestOf: (uploadPath: string) => string | undefined
): Promise<SideFileDigests | null> {
  const rows = await assetSideFiles().findAll({ where: { assetId } });
  const sideFiles: SideFileDigests = {};
  const folder = path.posix.dirname(assetPath);
  for (const row of rows) {
    const uploadPath = path.posix.normalize(path.posix.join(folder, row.path));
    // The reader never opens a path that climbs out of the asset's folder, so such a file is always missing.
    const isOutside = uploadPath === '..' || uploadPath.startsWith('../') || row.path.startsWith('../');
    const current = isOutside ? null : (digestOf(uploadPath) ?? null);
    if (current !== row.contentHash) return null;
    sideFiles[row.path] = current;
  }
  return sideFiles;
}

/**
 * The findings with `toPath` in place of `fromPath` and fingerprints recomputed, or null when a
 * fingerprint cannot be reproduced (see the design notes).
 */
export function restamp(findings: Finding[], fromPath: string, toPath: string): Finding[] | null {
  if (fromPath === toPath) return findings;
  const restamped: Finding[] = [];
  for (const finding of findings) {
    const target = recoverTarget(finding, fromPath);
    if (target === undefined) return null;
    const parts = { rule: finding.rule, animation: finding.animation, node: finding.node, target, time: finding.time };
    restamped.push({
      ...finding,
      asset: toPath,
      // Reader messages start with the asset path; rule messages name nodes and animations only.
      message: finding.message.startsWith(`${fromPath}: `)
        ? `${toPath}: ${finding.message.slice(fromPath.length + 2)}`
        : finding.message,
      fingerprint: fingerprintOf({ ...parts, asset: toPath })
    });
  }
  return restamped;
}

/** The fingerprint target that reproduces the stored fingerprint at `fromPath`; undefined when none does. */
function recoverTarget(finding: Finding, fromPath: string): string | null | undefined {
  const known = [
    null,
    'rotation',
    'rest',
    'world',
    'rotation:basis',
    'rotation:count',
    'rotation:cubic-keys',
    'rotation:tangent',
    'rotation:encoding',
    ...(finding.keys ? [`rotation@key${finding.keys[0]}`] : []),
    ...Array.from({ length: 64 }, (_, skinIndex) => `skin:${skinIndex}`)
  ];
  const parts = {
    rule: finding.rule,
    asset: fromPath,
    animation: finding.animation,
    node: finding.node,
    time: finding.time
  };
  return known.find((target) => fingerprintOf({ ...parts, target }) === finding.fingerprint);
}

function emptyStats(): AssetStats {
  return { animations: 0, rotationChannels: 0, rotationKeys: 0, nodesWithRotation: 0 };
}

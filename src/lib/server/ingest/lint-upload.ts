/**
 * Lints one received asset of an upload: `.glb` and `.gltf` files are assets, everything else
 * is a side file they may read. An asset whose stored twin matches (see find-reusable-lint.ts)
 * takes over that lint instead of running it again; an asset outside the policy's
 * include/exclude globs is skipped. Only one file's bytes are in memory at a time.
 *
 * No Draco decoder is passed to the library: rotation rules never look at geometry, and without
 * the decoder the reader skips compressed geometry and reads animations, nodes and skins as
 * usual, which saves starting a WebAssembly module per process and decoding meshes per upload.
 */
import type { AssetReport } from '../../lint/lint-report';
import type { Policy } from '../../lint/policy';
import { findReusableLint } from './find-reusable-lint';
import type { ReceivedFile } from './receive-upload';
import { lintOffMainThread } from './lint-thread';
import type { SideFileDigests } from './side-file-reader';

/** One asset of the upload with its lint result. */
export interface LintedAsset {
  file: ReceivedFile;
  report: AssetReport;
  /** Side files the lint read (relative to the asset's folder) and their digests; empty when skipped. */
  sideFiles: SideFileDigests;
  /** The stored asset whose lint was reused, or null when linted now (or skipped). */
  reusedFromAssetId: number | null;
}

/** True for a file that is an asset of its own (`.glb`, `.gltf`), not a side file. */
export function isAssetFile(uploadPath: string): boolean {
  return /\.(glb|gltf)$/i.test(uploadPath);
}

/**
 * Reuses a stored lint of the asset or lints it now (on a lint thread when there are any),
 * reading side files from `filesFolder`.
 * @param digests the SHA-256 of every wholly received file by its upload-relative path; a file
 *   not in it (not received yet, or not sent) reads as missing. The lint sees it as it is now.
 */
export async function lintReceivedAsset(
  file: ReceivedFile,
  filesFolder: string,
  policy: Policy,
  policyVersion: string,
  digests: ReadonlyMap<string, string>
): Promise<LintedAsset> {
  const received = new Map(digests);
  const reused = await findReusableLint(file, policyVersion, (uploadPath) => received.get(uploadPath));
  if (reused) {
    return { file, report: reused.report, sideFiles: reused.sideFiles, reusedFromAssetId: reused.sourceAssetId };
  }
  const { report, sideFiles } = await lintOffMainThread({
    assetPath: file.path,
    diskPath: file.diskPath,
    filesFolder,
    digests: received,
    policy
  });
  return { file, report, sideFiles, reusedFromAssetId: null };
}

/** True when the result read every side file it asked for: no later file of the upload can change it. */
export function readAllSideFiles(linted: LintedAsset): boolean {
  return Object.values(linted.sideFiles).every((digest) => digest !== null);
}

/** The result for an asset the policy's include/exclude globs leave out. */
export function skippedAsset(file: ReceivedFile): LintedAsset {
  return {
    file,
    report: {
      path: file.path,
      byteLength: file.byteLength,
      unreadable: false,
      skipped: true,
      stats: { animations: 0, rotationChannels: 0, rotationKeys: 0, nodesWithRotation: 0 },
      findings: []
    },
    sideFiles: {},
    reusedFromAssetId: null
  };
}

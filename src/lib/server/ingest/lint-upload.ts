/**
 * Lints the assets of a received upload, one at a time so only one file's bytes are in memory:
 * `.glb` and `.gltf` files are assets, everything else is a side file they may read. An asset
 * outside the policy's include/exclude globs is skipped, and one whose stored twin matches
 * (see find-reusable-lint.ts) takes over that lint instead of running it again.
 *
 * No Draco decoder is passed to the library: rotation rules never look at geometry, and without
 * the decoder the reader skips compressed geometry and reads animations, nodes and skins as
 * usual, which saves starting a WebAssembly module per process and decoding meshes per upload.
 */
import fs from 'node:fs';
import { lintAsset } from '../../lint/lint-asset';
import { isAssetIncluded } from '../../lint/asset-filter';
import type { AssetReport } from '../../lint/lint-report';
import type { Policy } from '../../lint/policy';
import { findReusableLint } from './find-reusable-lint';
import type { ReceivedFile } from './receive-upload';
import { createSideFileReader, type SideFileDigests } from './side-file-reader';

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

/** Lints (or reuses the lint of) every asset of the upload, in path order. */
export async function lintUpload(
  files: readonly ReceivedFile[],
  filesFolder: string,
  policy: Policy,
  policyVersion: string
): Promise<LintedAsset[]> {
  const digests = new Map(files.map((file) => [file.path, file.sha256]));
  const digestOf = (uploadPath: string) => digests.get(uploadPath);
  const assets = files.filter((file) => isAssetFile(file.path)).sort((a, b) => compareText(a.path, b.path));

  const linted: LintedAsset[] = [];
  for (const file of assets) {
    if (!isAssetIncluded(file.path, policy)) {
      linted.push({ file, report: skippedReport(file), sideFiles: {}, reusedFromAssetId: null });
      continue;
    }
    const reused = await findReusableLint(file, policyVersion, digestOf);
    if (reused) {
      linted.push({
        file,
        report: reused.report,
        sideFiles: reused.sideFiles,
        reusedFromAssetId: reused.sourceAssetId
      });
      continue;
    }
    const reader = createSideFileReader(filesFolder, file.path, digestOf);
    const bytes = await fs.promises.readFile(file.diskPath);
    const report = await lintAsset({ path: file.path, bytes, readSideFile: reader.readSideFile }, policy);
    linted.push({ file, report, sideFiles: { ...reader.requested }, reusedFromAssetId: null });
  }
  return linted;
}

function skippedReport(file: ReceivedFile): AssetReport {
  return {
    path: file.path,
    byteLength: file.byteLength,
    unreadable: false,
    skipped: true,
    stats: { animations: 0, rotationChannels: 0, rotationKeys: 0, nodesWithRotation: 0 },
    findings: []
  };
}

/** Code-unit order, the same on every machine (no locale). */
function compareText(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

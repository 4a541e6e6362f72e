/**
 * Lints one received asset from the upload folder: the part of an upload's lint that needs no
 * database, so it can run on the lint thread (lint-thread.ts) as well as on the request's own.
 * Everything it takes and gives survives structured cloning (plain objects, a Map).
 */
import { lintAsset } from '../../lint/lint-asset';
import { readReusableFileBytes } from '../../node/reusable-file-bytes';
import type { AssetReport } from '../../lint/lint-report';
import type { Policy } from '../../lint/policy';
import { createSideFileReader, type SideFileDigests } from './side-file-reader';

/** One asset to lint, with what the upload had received when the lint was asked for. */
export interface DiskLintJob {
  /** Upload-relative path of the asset. */
  assetPath: string;
  /** Where the asset's bytes are on disk. */
  diskPath: string;
  /** The upload's files folder: side files are read only from there. */
  filesFolder: string;
  /** SHA-256 of every wholly received file by upload-relative path; others read as missing. */
  digests: ReadonlyMap<string, string>;
  policy: Policy;
}

/** The asset's report and the side files it asked for (null: not read). */
export interface DiskLintResult {
  report: AssetReport;
  sideFiles: SideFileDigests;
}

/** Reads and lints the asset of `job`. Unreadable files become findings; only bugs throw. */
export async function lintFileOnDisk(job: DiskLintJob): Promise<DiskLintResult> {
  const reader = createSideFileReader(job.filesFolder, job.assetPath, (uploadPath) => job.digests.get(uploadPath));
  const file = await readReusableFileBytes(job.diskPath);
  try {
    const report = await lintAsset(
      { path: job.assetPath, bytes: file.bytes, readSideFile: reader.readSideFile },
      job.policy
    );
    return { report, sideFiles: { ...reader.requested } };
  } finally {
    // The report holds no view of the bytes (reports are plain data), so the buffer is free again.
    file.release();
  }
}

/**
 * Lints one file from disk with the lint library, for `check` and for `submit`'s local report.
 * A file the policy excludes is not read at all; a file that cannot even be opened becomes an
 * `asset-unreadable` finding, so the other files are still linted.
 */
import { dirname } from 'node:path';
import { isAssetIncluded, lintAsset, type AssetReport, type AssetSource, type Policy } from '$lib/lint';
import { readReusableFileBytes, type ReusableBytes } from '$lib/node/reusable-file-bytes';
import { getReadOptions } from './draco';
import { createSideFileReader, type InputFile } from './files';
import { unreadableAssetReport } from './unreadable-asset-report';

/** The file's report; reports name it by `file.displayPath`. */
export async function lintInputFile(file: InputFile, policy: Policy): Promise<AssetReport> {
  // The library reports an excluded asset as skipped without looking at its bytes; don't read them.
  if (!isAssetIncluded(file.displayPath, policy)) return lintAsset(unreadSource(file.displayPath), policy);
  let fileBytes: ReusableBytes;
  try {
    fileBytes = await readReusableFileBytes(file.absolutePath);
  } catch (error) {
    return unreadableAssetReport(file.displayPath, error, policy);
  }
  try {
    const source: AssetSource = {
      path: file.displayPath,
      bytes: fileBytes.bytes,
      readSideFile: createSideFileReader(dirname(file.absolutePath))
    };
    return await lintAsset(source, policy, await getReadOptions(source.bytes));
  } finally {
    // Reports are plain data: nothing views the bytes once the lint is done.
    fileBytes.release();
  }
}

/** A source with no bytes, for an asset the policy excludes (lintAsset skips it unread). */
function unreadSource(path: string): AssetSource {
  return { path, bytes: new Uint8Array(0), readSideFile: async () => null };
}

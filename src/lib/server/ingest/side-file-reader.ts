/**
 * The `readSideFile` the server gives the lint library for one uploaded asset. It reads only
 * files of this upload, only inside the main file's own folder, and never follows a link out
 * of it: every path is resolved, then resolved again through `realpath`, and checked to stay
 * inside the folder before it is opened. It reads only files whose upload has completed (they
 * have a digest), so an asset linted while the upload is still arriving never sees half a file.
 * It also records what was asked for, so the server knows exactly which side files an asset's
 * findings depend on.
 */
import fs from 'node:fs';
import path from 'node:path';

/** A side file an asset asked for: its SHA-256 when it was sent, null when it was not. */
export type SideFileDigests = Record<string, string | null>;

/** A side-file reader with the record of what it read. */
export interface RecordingSideFileReader {
  readSideFile(relativePath: string): Promise<Uint8Array | null>;
  /** Every path asked for (relative to the main file's folder), with the digest of what was read. */
  readonly requested: SideFileDigests;
}

/**
 * Makes the reader for the asset at `assetPath` (upload-relative) inside `filesFolder`.
 * @param digestOf the SHA-256 of an uploaded file by its upload-relative path, known once the file
 *   is wholly received; undefined for a path not (yet) received, which then reads as missing.
 */
export function createSideFileReader(
  filesFolder: string,
  assetPath: string,
  digestOf: (uploadPath: string) => string | undefined
): RecordingSideFileReader {
  const assetFolder = path.posix.dirname(assetPath);
  const requested: SideFileDigests = {};
  return {
    requested,
    async readSideFile(relativePath: string): Promise<Uint8Array | null> {
      const uploadPath = path.posix.normalize(path.posix.join(assetFolder, relativePath));
      const digest = digestOf(uploadPath);
      // Every file in the folder came from the upload, so one without a digest is absent or still arriving.
      const bytes =
        digest === undefined ? null : await readInside(path.join(filesFolder, ...assetFolder.split('/')), relativePath);
      requested[relativePath] = bytes === null ? null : (digest ?? null);
      return bytes;
    }
  };
}

/**
 * Reads `relativePath` inside `folder`, or null when it is not there, is not a regular file,
 * or would lie outside `folder` once resolved or once links are followed.
 */
export async function readInside(folder: string, relativePath: string): Promise<Uint8Array | null> {
  if (relativePath.includes('\u0000') || path.isAbsolute(relativePath)) return null;
  const base = await realpathOrNull(folder);
  if (base === null) return null;
  const candidate = path.resolve(base, relativePath);
  if (!isInside(base, candidate)) return null;
  const real = await realpathOrNull(candidate);
  if (real === null || !isInside(base, real)) return null;
  const stats = await fs.promises.stat(real);
  if (!stats.isFile()) return null;
  return fs.promises.readFile(real);
}

function isInside(folder: string, candidate: string): boolean {
  const relative = path.relative(folder, candidate);
  const climbsOut = relative === '..' || relative.startsWith(`..${path.sep}`);
  return relative !== '' && !climbsOut && !path.isAbsolute(relative);
}

async function realpathOrNull(file: string): Promise<string | null> {
  try {
    return await fs.promises.realpath(file);
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    // Missing, or a path through a file: either way the side file was not sent.
    if (code === 'ENOENT' || code === 'ENOTDIR') return null;
    throw error;
  }
}

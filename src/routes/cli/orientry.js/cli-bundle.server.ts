/**
 * The bundled command line (`cli/dist/orientry.js`, written by `npm run build:cli` and by
 * `npm run build`) as the server hands it out: its path, and its ETag (a SHA-256 of the content)
 * computed once per version of the file rather than per download.
 */
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

/** Where the bundle is, relative to the folder the server runs in (the repository root). */
export const CLI_BUNDLE_PATH = path.join('cli', 'dist', 'orientry.js');

/** The bundle on disk: an open handle to stream from, its size and its strong ETag. */
export interface CliBundle {
  handle: fs.promises.FileHandle;
  byteLength: number;
  etag: string;
}

let cachedEtag: { mtimeMs: number; byteLength: number; etag: string } | undefined;

/**
 * Opens the bundle, or returns null when it was never built. The handle is opened before the
 * hash is checked, so a rebuild that renames a new file into place mid-request cannot pair one
 * version's ETag with another version's bytes: both come from the same open file.
 * @throws for any failure other than a missing file.
 */
export async function openCliBundle(cwd = process.cwd()): Promise<CliBundle | null> {
  let handle: fs.promises.FileHandle;
  try {
    handle = await fs.promises.open(path.resolve(cwd, CLI_BUNDLE_PATH), 'r');
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'ENOENT') return null;
    throw error;
  }
  try {
    const stats = await handle.stat();
    if (!cachedEtag || cachedEtag.mtimeMs !== stats.mtimeMs || cachedEtag.byteLength !== stats.size) {
      const hash = crypto
        .createHash('sha256')
        .update(await handle.readFile())
        .digest('base64url');
      cachedEtag = { mtimeMs: stats.mtimeMs, byteLength: stats.size, etag: `"sha256-${hash}"` };
    }
    return { handle, byteLength: stats.size, etag: cachedEtag.etag };
  } catch (error) {
    await handle.close();
    throw error;
  }
}

/**
 * True when an `If-None-Match` header names `etag` (or is `*`), so a 304 may answer.
 * Weak comparison (RFC 9110 §13.1.2): a `W/` prefix on either side is ignored.
 */
export function matchesEtag(ifNoneMatch: string | null, etag: string): boolean {
  if (!ifNoneMatch) return false;
  const strip = (tag: string) => tag.trim().replace(/^W\//, '');
  return ifNoneMatch.split(',').some((tag) => tag.trim() === '*' || strip(tag) === strip(etag));
}

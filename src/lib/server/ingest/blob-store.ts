/**
 * Content-addressed storage of uploaded files under `<DATA_DIR>/blobs/ab/cdef…` (the SHA-256
 * split after two hex digits, so no folder grows past 256 entries at the top). Each content is
 * stored once, whatever path or build it came with; a blob appears whole or not at all because
 * it is written elsewhere and renamed into place.
 */
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { makeFolder } from './make-folder';

const SHA256_PATTERN = /^[0-9a-f]{64}$/;

/** The file path of a blob. */
export function blobPathOf(dataDir: string, sha256: string): string {
  if (!SHA256_PATTERN.test(sha256)) throw new Error(`blob id must be 64 lowercase hex digits, got "${sha256}"`);
  return path.join(dataDir, 'blobs', sha256.slice(0, 2), sha256.slice(2));
}

/**
 * Stores the file at `sourcePath` (already hashed to `sha256`) as a blob, moving it when it is
 * on the same file system and copying it otherwise. Does nothing when the blob already exists.
 * The source file is gone or left in place; callers treat it as consumed either way.
 */
export async function storeBlob(dataDir: string, sha256: string, sourcePath: string): Promise<void> {
  const target = blobPathOf(dataDir, sha256);
  if (await exists(target)) return;
  await makeFolder(path.dirname(target));
  try {
    // rename(2) is atomic: readers see no blob or the whole blob.
    await fs.promises.rename(sourcePath, target);
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'EXDEV') throw error;
    const temporary = `${target}.tmp-${crypto.randomBytes(6).toString('hex')}`;
    try {
      await fs.promises.copyFile(sourcePath, temporary);
      await fs.promises.rename(temporary, target);
    } finally {
      await fs.promises.rm(temporary, { force: true });
    }
  }
}

/**
 * Reads a blob's bytes, or null when it is not stored.
 * @throws for any read failure other than a missing blob.
 */
export async function readBlob(dataDir: string, sha256: string): Promise<Uint8Array | null> {
  try {
    return await fs.promises.readFile(blobPathOf(dataDir, sha256));
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'ENOENT') return null;
    throw error;
  }
}

async function exists(file: string): Promise<boolean> {
  try {
    await fs.promises.access(file);
    return true;
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'ENOENT') return false;
    throw error;
  }
}

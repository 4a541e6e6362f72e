/**
 * Makes a folder and any missing parents, failing with the file system's real reason.
 *
 * Design notes: Node 20's `mkdir(folder, { recursive: true })` answers ENOENT when the file
 * system refuses to create the folder for another reason: on a read-only mount it said ENOENT
 * where a plain mkdir said EROFS (measured on a read-only bind mount). ENOENT would read as a bug;
 * EROFS lets the server answer `storage.read-only`. So an ENOENT is asked again of the last level.
 */
import fs from 'node:fs';

/** `mkdir -p folder`; rejects with the error a plain mkdir of `folder` gives when that one is truer. */
export async function makeFolder(folder: string): Promise<void> {
  try {
    await fs.promises.mkdir(folder, { recursive: true });
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'ENOENT') throw error;
    // Succeeds only if the folder appeared meanwhile; otherwise fails with the real reason.
    await fs.promises.mkdir(folder).catch((retryError: NodeJS.ErrnoException) => {
      throw retryError.code === 'ENOENT' ? error : retryError;
    });
  }
}

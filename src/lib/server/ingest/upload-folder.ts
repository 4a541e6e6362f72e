/**
 * The temporary folder one upload is received into, under `<DATA_DIR>/uploads/`. It is removed
 * when the request ends, whatever happened; folders left by a process that died (a crash, a
 * SIGKILL mid-upload) are swept on the next upload.
 */
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

/** Folder names are `<pid>-<random>`, so a sweep can tell a live process's folder from a dead one's. */
const FOLDER_PATTERN = /^(\d+)-[0-9a-f]{16}$/;

/** A folder older than this is swept even if its process id is alive again (pid reuse). */
const STALE_AFTER_MS = 24 * 60 * 60 * 1000;

/** The uploads root inside a data folder. */
export function uploadsRootOf(dataDir: string): string {
  return path.join(dataDir, 'uploads');
}

/**
 * Runs `work` with a fresh, empty upload folder and removes the folder afterwards, also when
 * `work` throws. The first call in a process also sweeps folders of dead processes.
 */
export async function withUploadFolder<T>(dataDir: string, work: (folder: string) => Promise<T>): Promise<T> {
  const root = uploadsRootOf(dataDir);
  await fs.promises.mkdir(root, { recursive: true });
  // Best effort: a failed sweep only leaves old folders on disk, so it is logged and uploads go on.
  sweeping ??= sweepStaleUploads(root).catch((error: unknown) => {
    console.warn(`Orientry: could not sweep old upload folders in ${root}:`, error);
    return [];
  });
  await sweeping;
  const folder = path.join(root, `${process.pid}-${crypto.randomBytes(8).toString('hex')}`);
  await fs.promises.mkdir(folder);
  try {
    return await work(folder);
  } finally {
    await fs.promises.rm(folder, { recursive: true, force: true });
  }
}

let sweeping: Promise<string[]> | undefined;

/**
 * Removes upload folders whose process is gone or that are older than a day. Returns the
 * names removed. Safe to run while uploads of this process are in progress.
 */
export async function sweepStaleUploads(root: string, now = Date.now()): Promise<string[]> {
  const removed: string[] = [];
  let names: string[];
  try {
    names = await fs.promises.readdir(root);
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'ENOENT') return removed;
    throw error;
  }
  for (const name of names) {
    const match = FOLDER_PATTERN.exec(name);
    if (!match) continue;
    const folder = path.join(root, name);
    const pid = Number(match[1]);
    const stats = await fs.promises.stat(folder);
    const isOwnedByLiveProcess = pid === process.pid || isProcessAlive(pid);
    if (isOwnedByLiveProcess && now - stats.mtimeMs < STALE_AFTER_MS) continue;
    await fs.promises.rm(folder, { recursive: true, force: true });
    removed.push(name);
  }
  return removed;
}

/** True when a process with this id exists (signal 0 only checks). */
function isProcessAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (error) {
    // EPERM: the process exists but belongs to someone else, so it is alive.
    return (error as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/**
 * Canary files: files placed where a path escape would land, to prove afterwards that nobody
 * read them. Each gets an access time far in the past and a modification time of now; Linux
 * `relatime` (mount(8)) updates the access time on the next read whenever it is older than the
 * modification time, so any read moves it. A control canary read on purpose shows the file
 * system really records reads before the result is trusted.
 */
import fs from 'node:fs';
import path from 'node:path';

/** Access time given to every canary: 1970-01-12, far before any read. */
const OLD_ACCESS_SECONDS = 1_000_000;

/** Writes a canary at `file` (creating its folder) and returns `file`. */
export function placeCanary(file: string): string {
  fs.mkdirSync(path.dirname(file), { recursive: true });
  fs.writeFileSync(file, 'canary: a read of this file means a path escaped its folder\n');
  fs.utimesSync(file, OLD_ACCESS_SECONDS, new Date());
  return file;
}

/** True when `file` was read since {@link placeCanary} wrote it. */
export function wasCanaryRead(file: string): boolean {
  return fs.statSync(file).atimeMs / 1000 > OLD_ACCESS_SECONDS + 1;
}

/**
 * Places a canary in `folder`, reads it, and says whether the read showed: false means this file
 * system does not record reads (noatime) and canaries prove nothing here.
 */
export function doesFileSystemRecordReads(folder: string): boolean {
  const control = placeCanary(path.join(folder, `control-${process.pid}.bin`));
  try {
    fs.readFileSync(control);
    return wasCanaryRead(control);
  } finally {
    fs.rmSync(control, { force: true });
  }
}

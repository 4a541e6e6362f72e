import fs from 'node:fs';
import path from 'node:path';
import { ConfigError } from './errors';
import type { ServerConfig } from './config';

/**
 * Makes sure the data folder (and the database file's folder) exist and can be written,
 * before anything else touches them: a read-only volume then fails at start-up with one
 * clear line instead of a SQLite error on the first upload.
 * @throws ConfigError e.g. `Orientry cannot write to the data folder "/x/data" (EACCES). Set DATA_DIR ...`
 */
export function prepareDataDir(config: ServerConfig): void {
  assertWritable(
    config.dataDir,
    (code) =>
      `Orientry cannot write to the data folder "${config.dataDir}" (${code}). ` +
      'Set DATA_DIR to a writable folder or fix its permissions.'
  );
  if (config.database.dialect !== 'sqlite' || config.database.storage === ':memory:') return;
  const databaseDir = path.dirname(config.database.storage);
  if (path.resolve(databaseDir) === path.resolve(config.dataDir)) return;
  assertWritable(
    databaseDir,
    (code) =>
      `Orientry cannot write to the database folder "${databaseDir}" (${code}). ` +
      'Set DATABASE_URL to a file in a writable folder or fix its permissions.'
  );
}

/** Creates `dir` when missing and proves it writable with a probe file. */
function assertWritable(dir: string, describe: (code: string) => string): void {
  const probe = path.join(dir, `.write-check-${process.pid}`);
  try {
    fs.mkdirSync(dir, { recursive: true });
    fs.writeFileSync(probe, '');
    fs.rmSync(probe, { force: true });
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code ?? 'unknown error';
    throw new ConfigError('config.data-dir', describe(code), { cause: error });
  }
}

import { resolveAuthSecret } from './auth/auth-secret';
import { getConfig } from './config';
import { prepareDataDir } from './data-dir';
import { migrate } from './db/migrate';
import { assertDatabaseReachable, getDatabase } from './db/instance';
import { sweepStaleUploads, uploadsRootOf } from './ingest/upload-folder';

let started: Promise<string[]> | undefined;

/**
 * Gets the server ready to answer: validates the configuration, checks the data folder,
 * makes sure the session secret exists, removes upload folders a dead process left behind,
 * opens the database and applies pending migrations.
 * Runs once per process (later calls share the first call's promise); the server hook calls
 * it at start-up. Resolves to the migrations it applied.
 * @throws ConfigError with a one-line message when the setup needs fixing.
 */
export function prepareServer(): Promise<string[]> {
  started ??= prepare();
  return started;
}

async function prepare(): Promise<string[]> {
  const config = getConfig();
  prepareDataDir(config);
  resolveAuthSecret(config);
  await sweepStaleUploads(uploadsRootOf(config.dataDir));
  const database = getDatabase();
  await assertDatabaseReachable(database);
  return migrate(database.sequelize);
}

/**
 * Script entry for `node scripts/migrate.js`: applies pending migrations to the database named
 * by DATABASE_URL, as the server does at start-up. Bundled by scripts/run-ts.js.
 */
import { getConfig } from '../config';
import { prepareDataDir } from '../data-dir';
import { assertDatabaseReachable, closeDatabase, getDatabase } from './instance';
import { migrate } from './migrate';

/** Migrates the configured database and returns the applied migration names and the file. */
export async function migrateConfiguredDatabase(): Promise<{ applied: string[]; storage: string }> {
  const config = getConfig();
  prepareDataDir(config);
  const database = getDatabase();
  try {
    await assertDatabaseReachable(database);
    return { applied: await migrate(database.sequelize), storage: config.database.storage };
  } finally {
    await closeDatabase();
  }
}

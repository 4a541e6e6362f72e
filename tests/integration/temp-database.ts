import { openDatabaseUnderTest } from './helpers/database-under-test';
import type { Database } from '$lib/server/db/instance';

/**
 * A migrated database for one test file: a SQLite file in a fresh temporary folder, or a fresh
 * PostgreSQL database in the PostgreSQL pass (see helpers/database-under-test.ts).
 */
export interface TempDatabase {
  database: Database;
  /** The SQLite file, or undefined on PostgreSQL. */
  file: string | undefined;
  /** Closes the database and deletes it. */
  remove(): Promise<void>;
}

/** Opens (and by default migrates) a new database of the run's dialect. */
export async function openTempDatabase(options: { migrated?: boolean } = {}): Promise<TempDatabase> {
  return openDatabaseUnderTest(options);
}

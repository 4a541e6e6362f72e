import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { migrate } from '$lib/server/db/migrate';
import { openDatabase, type Database } from '$lib/server/db/instance';

/** A migrated SQLite database in a fresh temporary folder, for one test file. */
export interface TempDatabase {
  database: Database;
  dir: string;
  file: string;
  /** Closes the database and deletes the folder. */
  remove(): Promise<void>;
}

/** Opens (and by default migrates) a database file in a new temporary folder. */
export async function openTempDatabase(options: { migrated?: boolean } = {}): Promise<TempDatabase> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'orientry-db-'));
  const file = path.join(dir, 'test.db');
  const database = openDatabase({ dialect: 'sqlite', storage: file });
  if (options.migrated !== false) await migrate(database.sequelize);
  return {
    database,
    dir,
    file,
    async remove() {
      await database.sequelize.close();
      fs.rmSync(dir, { recursive: true, force: true });
    }
  };
}

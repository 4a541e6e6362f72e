/**
 * Script entry for `npm run demo` and the end-to-end server: makes a fresh demo database and
 * seeds it, then the caller starts the production server. Bundled by scripts/run-ts.js.
 */
import fs from 'node:fs';
import path from 'node:path';
import { getConfig, type ServerConfig } from '../config';
import { prepareDataDir } from '../data-dir';
import { ConfigError } from '../errors';
import { migrate } from '../db/migrate';
import { assertDatabaseReachable, closeDatabase, getDatabase } from '../db/instance';
import { seedDemo, type DemoSeed } from './seed';

export { seedHistory } from './history';
export { DEMO_ACCOUNTS, DEMO_PROJECTS } from './demo-accounts';

/**
 * Deletes the database named by DATABASE_URL (with its WAL files), migrates a new one and seeds
 * the demo scenario. Refuses to delete a database whose file name does not say `demo` or `e2e`,
 * so pointing DATABASE_URL at real data by mistake cannot wipe it.
 * @throws ConfigError with a one-line message when the folder or database is unusable.
 */
export async function prepareDemo(): Promise<DemoSeed & { databaseFile: string }> {
  const config = getConfig();
  prepareDataDir(config);
  removeDemoDatabase(config);
  const database = getDatabase();
  try {
    await assertDatabaseReachable(database);
    await migrate(database.sequelize);
    return { ...(await seedDemo()), databaseFile: config.database.storage };
  } finally {
    await closeDatabase();
  }
}

function removeDemoDatabase(config: ServerConfig): void {
  const file = config.database.storage;
  if (file === ':memory:' || !fs.existsSync(file)) return;
  if (!/demo|e2e/i.test(path.basename(file))) {
    throw new ConfigError(
      'config.demo-database',
      `The demo recreates its database, and "${file}" does not look like a demo database (no "demo" in its name). Point DATABASE_URL at a throw-away file such as sqlite:data/demo.db.`
    );
  }
  for (const suffix of ['', '-wal', '-shm', '-journal']) fs.rmSync(file + suffix, { force: true });
}

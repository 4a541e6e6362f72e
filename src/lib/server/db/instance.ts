/**
 * The one Sequelize instance over SQLite, with the models bound to it.
 * Every connection SQLite opens (the shared one and each transaction's own) gets WAL mode,
 * a 5 s busy timeout and foreign keys, so readers never block the writer and cascades work.
 */
import { Sequelize, Transaction } from 'sequelize';
import type { Database as SqliteConnection } from 'sqlite3';
import { getConfig } from '../config';
import { ConfigError } from '../errors';
import type { DatabaseLocation } from './database-url';
import { initModels, type Models } from './models';

/** An open database: the Sequelize instance and its models. */
export interface Database {
  sequelize: Sequelize;
  models: Models;
  location: DatabaseLocation;
}

/** Run on each new SQLite connection. WAL persists in the file; the others are per connection. */
const CONNECTION_PRAGMAS = ['PRAGMA busy_timeout = 5000', 'PRAGMA journal_mode = WAL', 'PRAGMA foreign_keys = ON'];

/**
 * Opens a database at `location` and binds the models to it. Most code wants {@link getDatabase};
 * tests and scripts open their own. Does not migrate: call `migrate(database.sequelize)`.
 */
export function openDatabase(location: DatabaseLocation, options: { logging?: boolean } = {}): Database {
  const sequelize = new Sequelize({
    dialect: 'sqlite',
    storage: location.storage,
    logging: options.logging ? (sql: string) => console.debug(sql) : false,
    // IMMEDIATE takes the write lock at BEGIN, so two writers wait (busy_timeout) instead of
    // failing with SQLITE_BUSY when a read transaction later tries to write.
    transactionType: Transaction.TYPES.IMMEDIATE,
    retry: { match: [/SQLITE_BUSY/], max: 5 }
  });
  prepareEveryConnection(sequelize);
  return { sequelize, models: initModels(sequelize), location };
}

/** Wraps the SQLite connection manager so each new connection runs {@link CONNECTION_PRAGMAS} once. */
function prepareEveryConnection(sequelize: Sequelize): void {
  const manager = sequelize.connectionManager as unknown as {
    getConnection(options?: object): Promise<SqliteConnection>;
  };
  const getConnection = manager.getConnection.bind(manager);
  const prepared = new WeakSet<SqliteConnection>();
  manager.getConnection = async (options) => {
    const connection = await getConnection(options);
    if (!prepared.has(connection)) {
      prepared.add(connection);
      for (const pragma of CONNECTION_PRAGMAS) await run(connection, pragma);
    }
    return connection;
  };
}

function run(connection: SqliteConnection, sql: string): Promise<void> {
  return new Promise((resolve, reject) =>
    connection.run(sql, (error: Error | null) => (error ? reject(error) : resolve()))
  );
}

let shared: Database | undefined;

/** The process-wide database from DATABASE_URL, opened on first use. */
export function getDatabase(): Database {
  shared ??= openDatabase(getConfig().database);
  return shared;
}

/** Closes the process-wide database (scripts call this before exiting). */
export async function closeDatabase(): Promise<void> {
  const database = shared;
  shared = undefined;
  await database?.sequelize.close();
}

/**
 * Checks that the database file can be opened and queried, turning SQLite's open errors into a
 * one-line ConfigError that names the file.
 */
export async function assertDatabaseReachable(database: Database): Promise<void> {
  try {
    await database.sequelize.query('SELECT 1');
  } catch (error) {
    const code = (error as { parent?: { code?: string }; original?: { code?: string } }).original?.code ?? 'error';
    throw new ConfigError(
      'config.database-open',
      `Orientry cannot open the database "${database.location.storage}" (${code}). Check DATABASE_URL and the file's permissions.`,
      { cause: error }
    );
  }
}

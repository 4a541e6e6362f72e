/**
 * The one Sequelize instance, over SQLite or PostgreSQL, with the models bound to it.
 * SQLite: every connection SQLite opens (the shared one and each transaction's own) gets WAL mode,
 * a 5 s busy timeout and foreign keys, so readers never block the writer and cascades work.
 * PostgreSQL: a connection pool to a server that several Orientry processes may share.
 */
import { Sequelize, Transaction, type Options } from 'sequelize';
import type { Database as SqliteConnection } from 'sqlite3';
import { getConfig } from '../config';
import { ConfigError } from '../errors';
import type { DatabaseLocation, PostgresLocation, SqliteLocation } from './database-url';
import { initModels, type Models } from './models';

/** An open database: the Sequelize instance and its models. */
export interface Database {
  sequelize: Sequelize;
  models: Models;
  location: DatabaseLocation;
}

/** Run on each new SQLite connection. WAL persists in the file; the others are per connection. */
const CONNECTION_PRAGMAS = ['PRAGMA busy_timeout = 5000', 'PRAGMA journal_mode = WAL', 'PRAGMA foreign_keys = ON'];

/** PostgreSQL type ids whose text the driver would otherwise hand back as strings. */
const PG_INT8_OID = 20;
const PG_NUMERIC_OID = 1700;

/**
 * Opens a database at `location` and binds the models to it. Most code wants {@link getDatabase};
 * tests and scripts open their own. Does not migrate: call `migrate(database.sequelize)`.
 */
export function openDatabase(location: DatabaseLocation, options: { logging?: boolean } = {}): Database {
  const logging = options.logging ? (sql: string) => console.debug(sql) : false;
  const sequelize = location.dialect === 'postgres' ? openPostgres(location, logging) : openSqlite(location, logging);
  return { sequelize, models: initModels(sequelize), location };
}

function openSqlite(location: SqliteLocation, logging: Options['logging']): Sequelize {
  const sequelize = new Sequelize({
    dialect: 'sqlite',
    storage: location.storage,
    logging,
    // IMMEDIATE takes the write lock at BEGIN, so two writers wait (busy_timeout) instead of
    // failing with SQLITE_BUSY when a read transaction later tries to write.
    transactionType: Transaction.TYPES.IMMEDIATE,
    retry: { match: [/SQLITE_BUSY/], max: 5 }
  });
  prepareEveryConnection(sequelize);
  return sequelize;
}

function openPostgres(location: PostgresLocation, logging: Options['logging']): Sequelize {
  // No transaction type: PostgreSQL has no IMMEDIATE; its row locks and unique indexes settle
  // concurrent writers, and READ COMMITTED (its default) is what the queries are written for.
  const sequelize = new Sequelize(location.url, { dialect: 'postgres', logging, timezone: '+00:00' });
  // COUNT(*) and SUM() come back as int8 and AVG() as numeric, which the driver returns as text
  // (they may exceed 2^53). Orientry's counts never do, and SQLite returns numbers, so both
  // dialects hand the queries numbers. The driver keeps one parser table per process.
  const driver = (sequelize.connectionManager as unknown as { lib: PgDriver }).lib;
  driver.types.setTypeParser(PG_INT8_OID, (text: string) => Number(text));
  driver.types.setTypeParser(PG_NUMERIC_OID, (text: string) => Number(text));
  return sequelize;
}

/** The part of the `pg` driver module used here (it ships no type declarations of its own). */
interface PgDriver {
  types: { setTypeParser(oid: number, parse: (text: string) => unknown): void };
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
 * Checks that the database can be opened and queried, turning the driver's open errors into a
 * one-line ConfigError that names the file (SQLite) or the server (PostgreSQL, password hidden).
 */
export async function assertDatabaseReachable(database: Database): Promise<void> {
  try {
    await database.sequelize.query('SELECT 1');
  } catch (error) {
    const code = (error as { parent?: { code?: string }; original?: { code?: string } }).original?.code ?? 'error';
    const advice =
      database.location.dialect === 'postgres'
        ? 'Check DATABASE_URL, that the server is running and that the user may connect to the database.'
        : "Check DATABASE_URL and the file's permissions.";
    throw new ConfigError(
      'config.database-open',
      `Orientry cannot open the database "${database.location.storage}" (${code}). ${advice}`,
      { cause: error }
    );
  }
}

/**
 * Plain multi-row INSERTs for the bulk of a build (assets, side files, findings): rows given as
 * value arrays in column order, escaped by Sequelize's own `escape` for the connected dialect.
 *
 * Design notes: `queryInterface.bulkInsert` takes one object per row and, for every value, looks
 * its key up in the list of all keys seen so far; with the 5,650 findings of the ingest
 * benchmark, making the row objects and the SQL that way took about 80 ms of a 190 ms write
 * transaction, which now takes about 130 ms. Most of the rest is SQLite's own work on the
 * statements (about 65 ms for those rows, measured with the sqlite3 driver alone).
 * The statements go straight to the transaction's own driver connection (sqlite3's `exec`, pg's
 * `query`): Sequelize's query path lower-cases and pattern-matches each statement's whole text
 * to guess what it is, which took another 20 ms for those rows. Other drivers go through
 * `sequelize.query`.
 * Part of a row can come escaped beforehand ({@link escapeValues}): ingestion escapes each
 * finding's own columns while the upload still arrives, so only the build's ids and standings
 * are left for the write at the end (30 ms of the 5,650 rows' SQL text moved off that path).
 */
import { QueryTypes, type Sequelize, type TableName, type Transaction } from 'sequelize';

/** Rows per statement: keeps each statement's SQL text to a few hundred kilobytes. */
const ROWS_PER_INSERT = 1000;

/** SQL literals escaped for one database, standing for `width` consecutive columns of a row. */
export class EscapedValues {
  constructor(
    readonly sql: string,
    readonly width: number
  ) {}
}

/** `values` as the comma-separated literals of `sequelize`'s dialect, for a row of {@link insertRows}. */
export function escapeValues(sequelize: Sequelize, values: readonly unknown[]): EscapedValues {
  return new EscapedValues(values.map((value) => escapeValue(sequelize, value)).join(','), values.length);
}

/**
 * Inserts `rows` (each with one value per column, in `columns` order) into `table`.
 * Values may be strings, finite numbers, booleans, null, or {@link EscapedValues} for several
 * columns at once.
 */
export async function insertRows(
  sequelize: Sequelize,
  table: TableName,
  columns: readonly string[],
  rows: readonly (readonly unknown[])[],
  transaction: Transaction
): Promise<void> {
  if (rows.length === 0) return;
  const queryGenerator = sequelize.getQueryInterface().queryGenerator as {
    quoteTable(table: TableName): string;
    quoteIdentifier(identifier: string): string;
  };
  const run =
    driverStatementRunner(transaction) ??
    // The type spares Sequelize guessing it from the statement's (long) text.
    (async (sql: string) => void (await sequelize.query(sql, { transaction, type: QueryTypes.INSERT })));
  const head =
    `INSERT INTO ${queryGenerator.quoteTable(table)} ` +
    `(${columns.map((column) => queryGenerator.quoteIdentifier(column)).join(',')}) VALUES `;
  for (let start = 0; start < rows.length; start += ROWS_PER_INSERT) {
    const tuples: string[] = [];
    for (const row of rows.slice(start, start + ROWS_PER_INSERT)) {
      let width = 0;
      const literals = row.map((value) => {
        if (value instanceof EscapedValues) {
          width += value.width;
          return value.sql;
        }
        width++;
        return escapeValue(sequelize, value);
      });
      if (width !== columns.length) {
        throw new Error(`insertRows: a row of ${width} values for ${columns.length} columns`);
      }
      tuples.push(`(${literals.join(',')})`);
    }
    await run(head + tuples.join(','));
  }
}

/** NULL for null; otherwise the dialect's literal (Sequelize's `escape` is typed narrower than it accepts). */
function escapeValue(sequelize: Sequelize, value: unknown): string {
  return value === null ? 'NULL' : sequelize.escape(value as string | number);
}

/** The parts of the driver connections used here (sqlite3's Database, pg's Client). */
interface SqliteDriverConnection {
  exec(sql: string, callback: (error: Error | null) => void): void;
  serialize(): void;
}
interface PgDriverConnection {
  query(sql: string): Promise<unknown>;
}

/**
 * Runs a statement on the connection Sequelize opened for `transaction`, inside it; null when
 * that connection is not one of the two drivers Orientry ships with.
 */
function driverStatementRunner(transaction: Transaction): ((sql: string) => Promise<void>) | null {
  const connection = (transaction as unknown as { connection?: unknown }).connection;
  if (!connection || typeof connection !== 'object') return null;
  if ('exec' in connection && 'serialize' in connection) {
    const sqlite = connection as SqliteDriverConnection;
    return (sql) => new Promise((resolve, reject) => sqlite.exec(sql, (error) => (error ? reject(error) : resolve())));
  }
  if ('query' in connection && typeof connection.query === 'function') {
    const pg = connection as PgDriverConnection;
    return async (sql) => void (await pg.query(sql));
  }
  return null;
}

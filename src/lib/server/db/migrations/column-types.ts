/**
 * Column types with CHECK constraints, for migrations, written once for SQLite and PostgreSQL.
 * Sequelize's ENUM becomes plain TEXT on SQLite and a separate type on PostgreSQL, so the allowed
 * values are written into the column definition instead. Identifiers use standard double quotes,
 * which both dialects read. Pattern checks differ (SQLite has GLOB, PostgreSQL has `~`), and so
 * does the JSON check, so those come from {@link columnTypes} for the dialect being migrated.
 * Migrations list their values literally: a later change to a model must not rewrite an old migration.
 */
import type { QueryInterface } from 'sequelize';

/** Name of the PostgreSQL function that says whether a text is valid JSON (SQLite has `json_valid`). */
export const POSTGRES_JSON_CHECK_FUNCTION = 'orientry_is_json';

/** CHECK builders for one dialect; each returns SQL to put in a column's `type`. */
export interface ColumnTypes {
  /** `VARCHAR(n)` restricted to `values`, e.g. `oneOf('role', ['lead', 'viewer'])`. */
  oneOf(column: string, values: readonly string[], length?: number): string;
  /** `type` with an arbitrary CHECK expression over the row. */
  checked(type: string, expression: string): string;
  /** A condition: `column` holds only characters of `characterClass` (a bracket class body, e.g. `0-9a-f`). */
  onlyCharacters(column: string, characterClass: string): string;
  /** A condition: `column` starts with a character of `characterClass`. */
  startsWithCharacter(column: string, characterClass: string): string;
  /** A condition: `column` is valid JSON text. */
  isJson(column: string): string;
}

/** `"column"`: an identifier both dialects accept. */
export function quoted(column: string): string {
  return `"${column.replace(/"/g, '""')}"`;
}

/** The CHECK builders for the dialect `queryInterface` talks to. */
export function columnTypes(queryInterface: QueryInterface): ColumnTypes {
  const isPostgres = queryInterface.sequelize.getDialect() === 'postgres';
  return {
    oneOf(column, values, length = 16) {
      const list = values.map((value) => `'${value.replace(/'/g, "''")}'`).join(', ');
      return `VARCHAR(${length}) CHECK (${quoted(column)} IN (${list}))`;
    },
    checked: (type, expression) => `${type} CHECK (${expression})`,
    // GLOB's [^...] and POSIX regular expressions' [^...] mean the same for these ASCII classes.
    onlyCharacters: (column, characterClass) =>
      isPostgres
        ? `${quoted(column)} !~ '[^${characterClass}]'`
        : `${quoted(column)} NOT GLOB '*[^${characterClass}]*'`,
    startsWithCharacter: (column, characterClass) =>
      isPostgres ? `${quoted(column)} ~ '^[${characterClass}]'` : `${quoted(column)} GLOB '[${characterClass}]*'`,
    isJson: (column) =>
      isPostgres ? `${POSTGRES_JSON_CHECK_FUNCTION}(${quoted(column)})` : `json_valid(${quoted(column)})`
  };
}

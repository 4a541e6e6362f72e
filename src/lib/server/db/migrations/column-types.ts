/**
 * Column types with SQLite CHECK constraints, for migrations. Sequelize's ENUM becomes plain
 * TEXT on SQLite, so the allowed values are written into the column definition instead.
 * Migrations list their values literally: a later change to a model must not rewrite an old migration.
 */

/** `VARCHAR(n)` restricted to `values`, e.g. `oneOf('role', ['lead', 'viewer'])`. */
export function oneOf(column: string, values: readonly string[], length = 16): string {
  const list = values.map((value) => `'${value.replace(/'/g, "''")}'`).join(', ');
  return `VARCHAR(${length}) CHECK (\`${column}\` IN (${list}))`;
}

/** `type` with an arbitrary CHECK expression over the row. */
export function checked(type: string, expression: string): string {
  return `${type} CHECK (${expression})`;
}

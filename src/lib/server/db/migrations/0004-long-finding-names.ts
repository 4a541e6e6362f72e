/**
 * Migration 0004: animation and node names of a finding come from the uploaded glTF file, which
 * sets no length on them. SQLite never enforces a VARCHAR length (sqlite.org/datatype3.html,
 * "Affinity Name Examples"), but PostgreSQL does and would refuse the whole build; on PostgreSQL
 * these two columns become TEXT. Nothing changes on SQLite.
 */
import type { QueryInterface } from 'sequelize';
import { quoted } from './column-types';

/** Name recorded in the migration table once applied. */
export const name = '0004-long-finding-names';

/** The columns and their length before this migration. */
const COLUMNS = [
  ['animation', 255],
  ['node', 1024]
] as const;

/** Makes `findings.animation` and `findings.node` unbounded TEXT on PostgreSQL. */
export async function up(queryInterface: QueryInterface): Promise<void> {
  if (queryInterface.sequelize.getDialect() !== 'postgres') return;
  const changes = COLUMNS.map(([column]) => `ALTER COLUMN ${quoted(column)} TYPE TEXT`);
  await queryInterface.sequelize.query(`ALTER TABLE ${quoted('findings')} ${changes.join(', ')}`);
}

/** Restores the bounded columns on PostgreSQL, cutting longer names to fit. */
export async function down(queryInterface: QueryInterface): Promise<void> {
  if (queryInterface.sequelize.getDialect() !== 'postgres') return;
  const changes = COLUMNS.map(
    ([column, length]) =>
      `ALTER COLUMN ${quoted(column)} TYPE VARCHAR(${length}) USING left(${quoted(column)}, ${length})`
  );
  await queryInterface.sequelize.query(`ALTER TABLE ${quoted('findings')} ${changes.join(', ')}`);
}

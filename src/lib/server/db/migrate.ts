import type { Sequelize } from 'sequelize';
import { SequelizeStorage, Umzug } from 'umzug';
import { MIGRATIONS, type Migration } from './migrations';

/** Table that records applied migrations (umzug's Sequelize storage). */
export const MIGRATION_TABLE = 'SequelizeMeta';

/**
 * Applies every pending migration, in order, and returns the names it applied (empty when
 * the schema is current, so calling it on every start is cheap and safe).
 * Used at server start and by scripts; never `sync()` a real database.
 */
export async function migrate(sequelize: Sequelize, migrations: readonly Migration[] = MIGRATIONS): Promise<string[]> {
  const applied = await umzugFor(sequelize, migrations).up();
  return applied.map((migration) => migration.name);
}

/** Names of the migrations already applied to this database, oldest first. */
export async function listAppliedMigrations(
  sequelize: Sequelize,
  migrations: readonly Migration[] = MIGRATIONS
): Promise<string[]> {
  const executed = await umzugFor(sequelize, migrations).executed();
  return executed.map((migration) => migration.name);
}

function umzugFor(sequelize: Sequelize, migrations: readonly Migration[]) {
  const queryInterface = sequelize.getQueryInterface();
  return new Umzug({
    migrations: migrations.map((migration) => ({
      name: migration.name,
      up: () => migration.up(queryInterface),
      down: () => migration.down(queryInterface)
    })),
    context: queryInterface,
    storage: new SequelizeStorage({ sequelize, tableName: MIGRATION_TABLE }),
    // Progress lines go nowhere: the caller reports what `migrate` returns.
    logger: undefined
  });
}

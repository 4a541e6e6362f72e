import type { Sequelize } from 'sequelize';
import { SequelizeStorage, Umzug } from 'umzug';
import { MIGRATIONS, type Migration } from './migrations';

/** Table that records applied migrations (umzug's Sequelize storage). */
export const MIGRATION_TABLE = 'SequelizeMeta';

/** Key of the PostgreSQL advisory lock that migrating servers queue on (any fixed number works). */
const MIGRATION_LOCK_KEY = 7_410_228;

/**
 * Applies every pending migration, in order, and returns the names it applied (empty when
 * the schema is current, so calling it on every start is cheap and safe).
 * Used at server start and by scripts; never `sync()` a real database.
 * On PostgreSQL several servers may start at once against one database: they queue on an advisory
 * lock, so one migrates and the others then find nothing left to apply.
 */
export async function migrate(sequelize: Sequelize, migrations: readonly Migration[] = MIGRATIONS): Promise<string[]> {
  const run = async () => (await umzugFor(sequelize, migrations).up()).map((migration) => migration.name);
  if (sequelize.getDialect() !== 'postgres') return run();
  // A transaction pins one pooled connection to hold the lock; it ends (and frees the lock) when
  // `run` settles. The migrations themselves run on other connections of the pool.
  return sequelize.transaction(async (transaction) => {
    await sequelize.query(`SELECT pg_advisory_xact_lock(${MIGRATION_LOCK_KEY})`, { transaction });
    return run();
  });
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

/**
 * Applies pending database migrations to DATABASE_URL (default sqlite:<DATA_DIR>/orientry.db),
 * as the server does when it starts. Usage: `node scripts/migrate.js`.
 */
import { importTs, reportScriptError } from './run-ts.js';

try {
  const { migrateConfiguredDatabase } = await importTs('src/lib/server/db/migrate-command.ts');
  const { applied, storage } = await migrateConfiguredDatabase();
  console.log(
    applied.length === 0
      ? `Orientry: database ${storage} is up to date.`
      : `Orientry: applied ${applied.join(', ')} to ${storage}.`
  );
} catch (error) {
  reportScriptError(error);
}

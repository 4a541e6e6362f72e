/**
 * The integration suite's PostgreSQL pass (`npm run test:integration:postgres`): the database
 * tests again, each test file on its own fresh database on the server at TEST_POSTGRES_URL
 * (see tests/integration/helpers/database-under-test.ts). Without TEST_POSTGRES_URL the pass
 * prints why it is skipped and succeeds, so `npm test` works on a machine without PostgreSQL;
 * CI (.ci/run) starts a server and sets the variable.
 */
import { sveltekit } from '@sveltejs/kit/vite';
import { defineConfig } from 'vitest/config';

const hasServer = (process.env.TEST_POSTGRES_URL ?? '').trim() !== '';
if (!hasServer) {
  console.log(
    'PostgreSQL pass skipped: TEST_POSTGRES_URL is not set. Start a throw-away server with ' +
      '`eval "$(scripts/postgres-test-server.sh start)"` to run it.'
  );
}

/**
 * Integration tests that stay SQLite-only, and why. Everything else under tests/integration runs
 * in this pass too.
 */
const SQLITE_ONLY = [
  // PRAGMAs, sqlite_master and WAL: SQLite's own machinery (postgres-migrations.test.ts is the counterpart).
  'tests/integration/migrations.test.ts',
  // DATABASE_URL parsing, data-folder and database-file permissions: no database server involved.
  'tests/integration/config.test.ts',
  // The default database file inside DATA_DIR.
  'tests/integration/health.test.ts',
  // The command-line linter and fixer: no database at all.
  'tests/integration/cli-check.test.ts',
  'tests/integration/cli-fix.test.ts',
  // submit against a fake server that gives no report: no database at all.
  'tests/integration/cli-submit-fallback-report.test.ts'
];

export default defineConfig({
  plugins: [sveltekit()],
  test: {
    include: hasServer ? ['tests/integration/**/*.test.ts'] : [],
    exclude: SQLITE_ONLY,
    passWithNoTests: true,
    environment: 'node',
    env: { ORIENTRY_TEST_DATABASE: 'postgres' },
    testTimeout: 30_000,
    hookTimeout: 120_000
  }
});

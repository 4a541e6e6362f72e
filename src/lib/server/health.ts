import { ENGINE_VERSION } from '../lint/version';
import { APP_VERSION } from './app-version';
import { getDatabase, type Database } from './db/instance';
import { lintThreadCount } from './ingest/lint-thread';

/** What GET /api/health answers: `degraded` (HTTP 503) when the database does not respond. */
export interface HealthReport {
  status: 'ok' | 'degraded';
  version: string;
  engineVersion: string;
  database: { ok: boolean; latencyMs: number };
  /** Threads that lint uploads; 0 when they are linted on the request's own thread. */
  lintThreads: number;
}

/**
 * Checks the parts the server cannot work without (today: the database, with one query) and
 * reports versions, for load balancers, uptime checks and the e2e harness.
 */
export async function checkHealth(database: Database = getDatabase()): Promise<HealthReport> {
  const started = performance.now();
  let ok = true;
  try {
    await database.sequelize.query('SELECT 1');
  } catch (error) {
    // Reported as `degraded` rather than thrown: the health route must answer even then.
    console.error('health: database check failed', error);
    ok = false;
  }
  const latencyMs = Math.round((performance.now() - started) * 100) / 100;
  return {
    status: ok ? 'ok' : 'degraded',
    version: APP_VERSION,
    engineVersion: ENGINE_VERSION,
    database: { ok, latencyMs },
    lintThreads: lintThreadCount()
  };
}

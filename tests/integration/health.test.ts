import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { resetConfig } from '$lib/server/config';
import { closeDatabase, getDatabase } from '$lib/server/db/instance';
import { prepareServer } from '$lib/server/startup';
import { ENGINE_VERSION } from '$lib/lint/version';
import packageJson from '../../package.json';
import { GET } from '../../src/routes/api/health/+server';

const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'orientry-health-'));

beforeAll(async () => {
  process.env.DATA_DIR = dataDir;
  delete process.env.DATABASE_URL;
  resetConfig();
  await prepareServer();
});
afterAll(async () => {
  await closeDatabase();
  fs.rmSync(dataDir, { recursive: true, force: true });
});

async function callHealth(): Promise<Response> {
  // The handler reads nothing from the request event.
  return GET({} as Parameters<typeof GET>[0]);
}

describe('GET /api/health', () => {
  it('answers 200 with versions and a working database', async () => {
    const response = await callHealth();
    expect(response.status).toBe(200);
    expect(response.headers.get('cache-control')).toBe('no-store');
    const body = await response.json();
    expect(body).toEqual({
      status: 'ok',
      version: packageJson.version,
      engineVersion: ENGINE_VERSION,
      database: { ok: true, latencyMs: expect.any(Number) },
      // Running the sources, there is no bundled lint thread: uploads lint on the request's thread.
      lintThreads: 0
    });
    expect(body.database.latencyMs).toBeGreaterThanOrEqual(0);
  });

  it('answers 503 degraded when the database does not respond', async () => {
    const query = vi
      .spyOn(getDatabase().sequelize, 'query')
      .mockRejectedValueOnce(new Error('SQLITE_IOERR: disk I/O error'));
    const quiet = vi.spyOn(console, 'error').mockImplementation(() => {});
    try {
      const response = await callHealth();
      expect(response.status).toBe(503);
      expect(await response.json()).toMatchObject({ status: 'degraded', database: { ok: false } });
      expect(quiet).toHaveBeenCalled();
    } finally {
      query.mockRestore();
      quiet.mockRestore();
    }
  });

  it('uses the database in the data folder, migrated at start-up', () => {
    expect(getDatabase().location.storage).toBe(path.join(dataDir, 'orientry.db'));
    expect(fs.existsSync(path.join(dataDir, 'orientry.db'))).toBe(true);
  });
});

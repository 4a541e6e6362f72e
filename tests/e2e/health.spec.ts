import { expect, test } from '@playwright/test';
import packageJson from '../../package.json' with { type: 'json' };

test('GET /api/health answers without sign-in, with versions and the database state', async ({ request }) => {
  const response = await request.get('/api/health');
  expect(response.status()).toBe(200);
  expect(await response.json()).toMatchObject({
    status: 'ok',
    version: packageJson.version,
    engineVersion: expect.stringMatching(/^\d+\.\d+\.\d+$/),
    database: { ok: true },
    // The production build lints uploads on its own thread (build/lint-worker.mjs).
    lintThread: 'worker'
  });
});

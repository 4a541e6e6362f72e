import { expect, test } from '@playwright/test';
import packageJson from '../../package.json' with { type: 'json' };

test('GET /api/health answers without sign-in, with versions and the database state', async ({ request }) => {
  const response = await request.get('/api/health');
  expect(response.status()).toBe(200);
  const body = await response.json();
  expect(body).toMatchObject({
    status: 'ok',
    version: packageJson.version,
    engineVersion: expect.stringMatching(/^\d+\.\d+\.\d+$/),
    database: { ok: true }
  });
  // The production build lints uploads on threads of their own (build/lint-worker.mjs).
  expect(body.lintThreads).toBeGreaterThan(0);
});

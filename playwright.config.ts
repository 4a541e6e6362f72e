import { defineConfig, devices } from '@playwright/test';

/**
 * End-to-end tests run against the production build (`node build`) with the demo scenario seeded
 * into a throw-away data folder: `scripts/e2e-server.js` builds when sources changed, seeds, starts
 * the server and removes the folder when it stops. Browsers come from Debian (`/usr/bin/chromium`):
 * nothing is downloaded. E2E_PORT picks the port (default 4173).
 */
const port = Number(process.env.E2E_PORT ?? 4173);
const baseURL = `http://127.0.0.1:${port}`;

export default defineConfig({
  testDir: 'tests/e2e',
  outputDir: 'test-results',
  timeout: 60_000,
  expect: { timeout: 10_000 },
  workers: 1,
  reporter: [['list']],
  use: {
    ...devices['Desktop Chrome'],
    baseURL,
    viewport: { width: 1280, height: 800 },
    launchOptions: {
      executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
      args: [
        '--no-sandbox',
        '--headless',
        '--disable-gpu',
        '--disable-background-networking',
        '--disable-component-update',
        '--disable-sync',
        '--no-first-run'
      ]
    }
  },
  webServer: {
    command: 'node scripts/e2e-server.js',
    url: `${baseURL}/api/health`,
    env: { PORT: String(port), HOST: '127.0.0.1', ORIGIN: baseURL },
    timeout: 240_000,
    reuseExistingServer: false,
    stdout: 'pipe'
  }
});

import { defineConfig, devices } from '@playwright/test';

/**
 * End-to-end tests run against the production build (`node build`) on a free port with a
 * throw-away database; `tests/e2e/global-setup.ts` picks the port and prepares the data folder.
 * Browsers come from Debian (`/usr/bin/chromium`): nothing is downloaded.
 */
const port = Number(process.env.E2E_PORT ?? 4173);
const baseURL = `http://127.0.0.1:${port}`;

export default defineConfig({
  testDir: 'tests/e2e',
  outputDir: 'test-results',
  timeout: 60_000,
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
    command: `node scripts/e2e-server.js`,
    url: `${baseURL}/api/health`,
    env: { PORT: String(port), HOST: '127.0.0.1', ORIGIN: baseURL },
    timeout: 240_000,
    reuseExistingServer: false,
    stdout: 'pipe'
  }
});

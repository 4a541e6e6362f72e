/**
 * Web server for the Playwright tests: builds the app if needed, seeds the demo scenario into a
 * throw-away data folder (removed on exit) and runs `node build` with PORT, HOST and ORIGIN
 * from the environment (playwright.config.ts sets them). Prints nothing secret worth keeping.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { ensureBuild } from './ensure-build.js';
import { importTs, reportScriptError } from './run-ts.js';
import { followServer, startServer } from './serve-build.js';

const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'orientry-e2e-'));
const removeDataDir = () => fs.rmSync(dataDir, { recursive: true, force: true });

try {
  const port = process.env.PORT ?? '4173';
  const host = process.env.HOST ?? '127.0.0.1';
  const url = `http://${host}:${port}`;
  process.env.DATA_DIR = dataDir;
  process.env.DATABASE_URL = `sqlite:${path.join(dataDir, 'e2e.db')}`;

  ensureBuild();
  const demo = await importTs('src/lib/server/demo/prepare-demo.ts');
  const seed = await demo.prepareDemo();
  const child = await startServer({
    env: { ...process.env, PORT: port, HOST: host, ORIGIN: process.env.ORIGIN ?? url },
    url
  });
  followServer(child, removeDataDir);
  await demo.seedHistory(url, seed.tokens);
  console.log(`Orientry e2e server ready at ${url} (data in ${dataDir})`);
} catch (error) {
  removeDataDir();
  reportScriptError(error);
  process.exit(process.exitCode ?? 1);
}

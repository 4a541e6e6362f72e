/**
 * Web server for the Playwright tests: builds the app if needed, seeds the demo scenario into a
 * throw-away data folder and runs a private copy of build/ with PORT, HOST and ORIGIN from the
 * environment (playwright.config.ts sets them). Both are removed when the server stops.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { ensureBuild } from './ensure-build.js';
import { importTs, reportScriptError } from './run-ts.js';
import { followServer, snapshotBuild, startServer } from './serve-build.js';

const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'orientry-e2e-'));
let buildDir = '';
const removeDataDir = () => {
  fs.rmSync(dataDir, { recursive: true, force: true });
  if (buildDir) fs.rmSync(buildDir, { recursive: true, force: true });
};

try {
  const port = process.env.PORT ?? '4173';
  const host = process.env.HOST ?? '127.0.0.1';
  const url = `http://${host}:${port}`;
  process.env.DATA_DIR = dataDir;
  process.env.DATABASE_URL = `sqlite:${path.join(dataDir, 'e2e.db')}`;

  ensureBuild();
  buildDir = snapshotBuild();
  const demo = await importTs('src/lib/server/demo/prepare-demo.ts');
  const seed = await demo.prepareDemo();
  const child = await startServer({
    env: { ...process.env, PORT: port, HOST: host, ORIGIN: process.env.ORIGIN ?? url },
    url,
    buildDir
  });
  followServer(child, removeDataDir);
  await demo.seedHistory(url, seed.tokens);
  console.log(`Orientry e2e server ready at ${url} (data in ${dataDir})`);
} catch (error) {
  removeDataDir();
  reportScriptError(error);
  process.exit(process.exitCode ?? 1);
}

/**
 * Builds the app (`npm run build`) when build/ is missing or older than its sources, so the
 * demo and the end-to-end tests always run the current code without rebuilding every time.
 */
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { ROOT } from './run-ts.js';

const SOURCES = [
  'src',
  'static',
  'svelte.config.js',
  'vite.config.ts',
  'package.json',
  'tailwind.config.js',
  'postcss.config.js'
];

/**
 * Newest modification time (ms) under `target`, skipping tests; 0 when it does not exist.
 * @param {string} target
 * @returns {number}
 */
function newestMtime(target) {
  let stat;
  try {
    stat = fs.statSync(target);
  } catch {
    // A source folder that does not exist (e.g. no static/) cannot be newer than the build.
    return 0;
  }
  if (!stat.isDirectory()) return /\.(test|spec)\.[jt]s$/.test(target) ? 0 : stat.mtimeMs;
  let newest = 0;
  for (const name of fs.readdirSync(target)) newest = Math.max(newest, newestMtime(path.join(target, name)));
  return newest;
}

/**
 * Runs `npm run build` if build/handler.js is missing or any source is newer.
 * @param {{ force?: boolean }} [options]
 * @returns {boolean} true when it built
 */
export function ensureBuild(options = {}) {
  const marker = path.join(ROOT, 'build', 'handler.js');
  const builtAt = fs.existsSync(marker) ? fs.statSync(marker).mtimeMs : 0;
  const sourcesAt = Math.max(...SOURCES.map((source) => newestMtime(path.join(ROOT, source))));
  if (!options.force && builtAt > 0 && sourcesAt <= builtAt) {
    console.log('Orientry: build/ is up to date.');
    return false;
  }
  console.log(
    builtAt === 0
      ? 'Orientry: building the app (npm run build)...'
      : 'Orientry: sources changed, rebuilding (npm run build)...'
  );
  // A production build whatever the caller's NODE_ENV: `dev` from $app/environment is fixed at build time.
  const result = spawnSync('npm', ['run', 'build'], {
    cwd: ROOT,
    env: { ...process.env, NODE_ENV: 'production' },
    stdio: ['ignore', 'inherit', 'inherit']
  });
  if (result.status !== 0) throw new Error(`npm run build failed (exit code ${result.status ?? result.signal}).`);
  return true;
}

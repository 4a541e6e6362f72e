/**
 * Starts the production server (`node build`) as a child process and waits until
 * /api/health answers, for the demo and the end-to-end tests.
 */
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { ROOT } from './run-ts.js';

/**
 * Copies build/ to a private folder inside node_modules/.cache/orientry/ (so the copy still finds
 * node_modules) and returns its path. A server run from the copy keeps working when build/ is
 * rebuilt underneath it, which happens when tests and a rebuild run side by side.
 * @returns {string}
 */
export function snapshotBuild() {
  const target = path.join(ROOT, 'node_modules', '.cache', 'orientry', `build-${process.pid}`);
  fs.rmSync(target, { recursive: true, force: true });
  fs.cpSync(path.join(ROOT, 'build'), target, { recursive: true });
  // Inside node_modules the repository's package.json no longer applies: mark the files as ES modules.
  fs.writeFileSync(path.join(target, 'package.json'), '{ "type": "module" }\n');
  return target;
}

/**
 * Spawns `node <buildDir>` with `env` and resolves once GET `${url}/api/health` returns 200.
 * Rejects if the server exits first or does not answer within `timeoutMs`.
 * @param {{ env: NodeJS.ProcessEnv, url: string, buildDir?: string, timeoutMs?: number }} options
 * @returns {Promise<import('node:child_process').ChildProcess>}
 */
export async function startServer({ env, url, buildDir = path.join(ROOT, 'build'), timeoutMs = 60_000 }) {
  const child = spawn(process.execPath, [buildDir], {
    cwd: ROOT,
    // adapter-node caps request bodies at 512 KiB by default; uploads are limited by Orientry itself.
    env: { NODE_ENV: 'production', BODY_SIZE_LIMIT: 'Infinity', ...env },
    stdio: 'inherit'
  });
  let exited = null;
  child.once('exit', (code, signal) => {
    exited = { code, signal };
  });
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (exited) throw new Error(`The server stopped before it was ready (exit code ${exited.code ?? exited.signal}).`);
    try {
      const response = await fetch(`${url}/api/health`);
      if (response.ok) return child;
    } catch {
      // Not listening yet: connection refused is the expected answer while it starts.
    }
    await new Promise((resolve) => setTimeout(resolve, 250));
  }
  child.kill('SIGTERM');
  throw new Error(`The server did not answer ${url}/api/health within ${timeoutMs / 1000} s.`);
}

/**
 * Passes Ctrl-C and termination on to the server and ends this process when the server ends.
 * @param {import('node:child_process').ChildProcess} child
 * @param {() => void} [onExit] clean-up to run before exiting
 */
export function followServer(child, onExit = () => {}) {
  for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => child.kill(signal));
  child.once('exit', (code, signal) => {
    onExit();
    process.exitCode = code ?? (signal ? 0 : 1);
  });
}

/**
 * Starting and stopping real Orientry servers (`node build`) for integration tests: a free port,
 * a private copy of the production build, a launch that waits for the health route, a stop that
 * waits for the exit. Shared by the API test server and the tests that run extra servers.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { ensureBuild } from '../../../scripts/ensure-build.js';

export const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..', '..');

/** What {@link launchServer} needs. */
export interface LaunchOptions {
  /** A build folder, normally from {@link copyOfBuild}. */
  buildDir: string;
  env: NodeJS.ProcessEnv;
  /** The URL the server will answer on (from its PORT and HOST), polled at `/api/health`. */
  url: string;
  /** Folder to run in; default the repository root. */
  cwd?: string;
  /** Collects the lines the server prints (stdout and stderr), for failure messages. */
  output?: string[];
}

/** Starts `node <buildDir>` and resolves once its health route answers 200; fails with its output otherwise. */
export async function launchServer(options: LaunchOptions): Promise<ChildProcess> {
  const output = options.output ?? [];
  const child = spawn(process.execPath, [options.buildDir], {
    cwd: options.cwd ?? ROOT,
    env: options.env,
    stdio: ['ignore', 'pipe', 'pipe']
  });
  for (const stream of [child.stdout!, child.stderr!]) {
    stream.setEncoding('utf8');
    stream.on('data', (text: string) => output.push(...text.split('\n').filter(Boolean)));
  }
  const deadline = Date.now() + 30_000;
  while (Date.now() < deadline) {
    if (child.exitCode !== null || child.signalCode !== null) {
      throw new Error(`The test server exited early:\n${output.join('\n')}`);
    }
    try {
      if ((await fetch(`${options.url}/api/health`)).ok) return child;
    } catch {
      // Connection refused until the server listens: expected while it starts.
    }
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
  child.kill('SIGKILL');
  throw new Error(`The test server did not answer within 30 s:\n${output.join('\n')}`);
}

/** Sends `signal` (default SIGTERM) and waits for the exit; nothing when it has exited already. */
export async function stopChild(child: ChildProcess, signal: NodeJS.Signals = 'SIGTERM'): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) return;
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  child.kill(signal);
  await exited;
}

/**
 * A TCP port nobody listens on right now, below Linux's ephemeral range (32768–60999 by default).
 * A port the system hands out for `listen(0)` (a server's mail catcher, an SMTP sink) would be
 * free again the moment this probe closes it, and another process could be given it before the
 * server that was meant to have it starts: that race made a CI run fail with EADDRINUSE. Ports
 * below the range are never handed out that way; parallel test files pick them at random.
 */
export async function freePort(): Promise<number> {
  for (let attempt = 0; attempt < 50; attempt++) {
    const port = FIRST_PICKED_PORT + Math.floor(Math.random() * (LAST_PICKED_PORT - FIRST_PICKED_PORT + 1));
    if (await isFree(port)) return port;
  }
  throw new Error(`No free port between ${FIRST_PICKED_PORT} and ${LAST_PICKED_PORT} after 50 tries.`);
}

const FIRST_PICKED_PORT = 20_000;
const LAST_PICKED_PORT = 32_000;

function isFree(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const probe = net.createServer();
    probe.once('error', () => resolve(false));
    probe.listen(port, '127.0.0.1', () => probe.close(() => resolve(true)));
  });
}

/**
 * A private copy of the current build (built first when stale), so a rebuild started by another
 * test file cannot swap route chunks under a running server. It lives under node_modules/.cache
 * so the server still resolves its packages from the project's node_modules.
 * @param name what the copy is for, part of its folder name.
 */
export async function copyOfBuild(name: string): Promise<string> {
  const copy = path.join(ROOT, 'node_modules', '.cache', 'orientry', `${name}-${process.pid}-${Date.now()}`);
  await withBuildLock(async () => {
    ensureBuild();
    fs.cpSync(path.join(ROOT, 'build'), copy, { recursive: true });
  });
  return copy;
}

/**
 * Runs `work` under a lock folder, so test files starting together in parallel workers build
 * once instead of overwriting each other's build/ folder.
 */
async function withBuildLock(work: () => Promise<void>): Promise<void> {
  const lock = path.join(ROOT, 'node_modules', '.cache', 'orientry', 'build.lock');
  fs.mkdirSync(path.dirname(lock), { recursive: true });
  const deadline = Date.now() + 600_000;
  for (;;) {
    try {
      fs.mkdirSync(lock);
      break;
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code !== 'EEXIST') throw error;
      // A lock older than the longest build is left by a killed run: take it over.
      if (Date.now() - fs.statSync(lock).mtimeMs > 600_000) fs.rmSync(lock, { recursive: true, force: true });
      if (Date.now() > deadline) throw new Error(`Waited 10 minutes for the build lock ${lock}.`, { cause: error });
      await new Promise((resolve) => setTimeout(resolve, 500));
    }
  }
  try {
    await work();
  } finally {
    fs.rmSync(lock, { recursive: true, force: true });
  }
}

/**
 * The production server (`node build`) for benchmarks that talk to it over HTTP: started on a free
 * port against a given DATABASE_URL with its own data folder, from a private copy of build/ so a
 * rebuild elsewhere cannot swap files under it.
 */
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { cpuProfileArgs } from './cpu-profile';
import { freePort, stopChild, waitForHealth } from './server-process';

/** A running server. */
export interface OrientryServer {
  url: string;
  /** The server's process id, for CPU figures. */
  pid: number;
  /** What the server printed, for error messages. */
  output: string[];
  /** Stops the server and deletes its data folder. */
  stop(): Promise<void>;
}

/** Copies build/ (which must be current: see scripts/ensure-build.js) to a private folder. */
export function copyBuild(root: string): string {
  const copy = path.join(root, 'node_modules', '.cache', 'orientry', `bench-build-${process.pid}-${Date.now()}`);
  fs.cpSync(path.join(root, 'build'), copy, { recursive: true });
  // Inside node_modules the repository's package.json no longer applies: mark the files as ES modules.
  fs.writeFileSync(path.join(copy, 'package.json'), '{ "type": "module" }\n');
  return copy;
}

/**
 * Starts `node <buildDir>` in `root` against `databaseUrl` (already migrated) and waits until
 * /api/health answers. Mail goes to the process's own local catcher.
 */
export async function startOrientryServer(
  root: string,
  buildDir: string,
  databaseUrl: string
): Promise<OrientryServer> {
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'orientry-bench-data-'));
  const port = await freePort();
  const url = `http://127.0.0.1:${port}`;
  const output: string[] = [];
  const child = spawn(process.execPath, [...cpuProfileArgs('server'), buildDir], {
    cwd: root,
    env: {
      ...process.env,
      NODE_ENV: 'production',
      BODY_SIZE_LIMIT: 'Infinity',
      AUTH_SECRET: 'bench-secret-that-is-at-least-32-characters-long',
      PORT: String(port),
      HOST: '127.0.0.1',
      ORIGIN: url,
      DATA_DIR: dataDir,
      DATABASE_URL: databaseUrl
    },
    stdio: ['ignore', 'pipe', 'pipe']
  });
  for (const stream of [child.stdout!, child.stderr!]) {
    stream.setEncoding('utf8').on('data', (text: string) => output.push(text));
  }
  const stop = async () => {
    await stopChild(child);
    fs.rmSync(dataDir, { recursive: true, force: true });
  };
  try {
    await waitForHealth(child, url, output);
  } catch (error) {
    await stop();
    throw error;
  }
  return { url, pid: child.pid!, output, stop };
}

/**
 * Signs in through the sign-in form as a browser does and returns the Cookie header for later
 * requests.
 */
export async function signIn(server: OrientryServer, email: string, password: string): Promise<string> {
  const response = await fetch(`${server.url}/signin`, {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded', origin: server.url },
    body: new URLSearchParams({ email, password, redirectTo: '/' })
  });
  const cookies = response.headers
    .getSetCookie()
    .map((cookie) => cookie.split(';')[0])
    .filter((pair) => pair.includes('session-token=') && !pair.endsWith('='));
  if (cookies.length === 0) throw new Error(`Sign-in as ${email} failed with HTTP ${response.status}.`);
  return cookies.join('; ');
}

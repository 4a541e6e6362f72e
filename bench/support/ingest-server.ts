/**
 * A throw-away Orientry server for the ingestion benchmark: the production build (`node build`,
 * from a private copy so a rebuild elsewhere cannot swap files under it) on a free port, with its
 * own data folder and SQLite database, a seeded project and a submit token.
 */
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { migrate } from '$lib/server/db/migrate';
import { openDatabase, type Database } from '$lib/server/db/instance';
import { Build, Project } from '$lib/server/db/models';
import * as apiTokens from '$lib/server/tokens/api-tokens';
import { freePort, stopChild, waitForHealth } from './server-process';

/** A running bench server. */
export interface IngestServer {
  url: string;
  project: string;
  secret: string;
  /** The server's process id, for CPU figures. */
  pid: number;
  /** The server's own time for the latest build (`durationMs`: receive, lint, compare, before the write). */
  latestBuildDurationMs(): Promise<number | null>;
  /** Stops the server and deletes its data folder. */
  remove(): Promise<void>;
}

/**
 * Seeds a fresh data folder and starts `node <buildDir>` in `root` with an unlimited body size.
 * @param buildDir a copy of build/ (see the bench's own copy step).
 */
export async function startIngestServer(root: string, buildDir: string): Promise<IngestServer> {
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'orientry-bench-'));
  const storage = path.join(dataDir, 'orientry.db');
  const database: Database = openDatabase({ dialect: 'sqlite', storage });
  await migrate(database.sequelize);
  const project = await Project.create({ slug: 'tidewatch', name: 'Tidewatch', baseBranch: 'main' });
  const { secret } = await apiTokens.create(project.id, 'Bench CI', null);

  const port = await freePort();
  const url = `http://127.0.0.1:${port}`;
  const output: string[] = [];
  const child = spawn(process.execPath, [buildDir], {
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
      DATABASE_URL: `sqlite:${storage}`
    },
    stdio: ['ignore', 'pipe', 'pipe']
  });
  for (const stream of [child.stdout!, child.stderr!])
    stream.setEncoding('utf8').on('data', (text: string) => output.push(text));
  try {
    await waitForHealth(child, url, output, 30_000);
    // A server that has run a while has its routes loaded; SvelteKit loads a route's module (and
    // the lint library with it) on the route's first request. An unsigned GET of the same route
    // loads it without storing anything, so the timed upload is not billed for it.
    await (await fetch(`${url}/api/v1/projects/${project.slug}/builds`)).arrayBuffer();
  } catch (error) {
    await stopChild(child);
    await database.sequelize.close();
    fs.rmSync(dataDir, { recursive: true, force: true });
    throw error;
  }
  return {
    url,
    project: project.slug,
    secret,
    pid: child.pid!,
    async latestBuildDurationMs() {
      const build = await Build.findOne({ order: [['id', 'DESC']] });
      return build?.durationMs ?? null;
    },
    async remove() {
      await stopChild(child);
      await database.sequelize.close();
      fs.rmSync(dataDir, { recursive: true, force: true });
    }
  };
}

/**
 * A throw-away Orientry server for the ingestion benchmark: the production server of
 * orientry-server.ts on its own SQLite database, with a seeded project and a submit token.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { migrate } from '$lib/server/db/migrate';
import { openDatabase, type Database } from '$lib/server/db/instance';
import { Build, Project } from '$lib/server/db/models';
import * as apiTokens from '$lib/server/tokens/api-tokens';
import { startOrientryServer } from './orientry-server';

/** A running bench server. */
export interface IngestServer {
  url: string;
  project: string;
  secret: string;
  /** The server's process id, for CPU figures. */
  pid: number;
  /** The server's own time for the latest build (`durationMs`: receive, lint, compare, before the write). */
  latestBuildDurationMs(): Promise<number | null>;
  /** Stops the server and deletes its database. */
  remove(): Promise<void>;
}

/**
 * Seeds a fresh SQLite database and starts `node <buildDir>` in `root` on it.
 * @param buildDir a copy of build/ (see orientry-server.ts's copyBuild).
 */
export async function startIngestServer(root: string, buildDir: string): Promise<IngestServer> {
  const databaseDir = fs.mkdtempSync(path.join(os.tmpdir(), 'orientry-bench-'));
  const storage = path.join(databaseDir, 'orientry.db');
  const database: Database = openDatabase({ dialect: 'sqlite', storage });
  const removeDatabase = async () => {
    await database.sequelize.close();
    fs.rmSync(databaseDir, { recursive: true, force: true });
  };
  let server: Awaited<ReturnType<typeof startOrientryServer>>;
  let project: Project;
  let secret: string;
  try {
    await migrate(database.sequelize);
    project = await Project.create({ slug: 'tidewatch', name: 'Tidewatch', baseBranch: 'main' });
    ({ secret } = await apiTokens.create(project.id, 'Bench CI', null));
    server = await startOrientryServer(root, buildDir, `sqlite:${storage}`);
  } catch (error) {
    await removeDatabase();
    throw error;
  }
  try {
    // A server that has run a while has its routes loaded; SvelteKit loads a route's module (and
    // the lint library with it) on the route's first request. An unsigned GET of the same route
    // loads it without storing anything, so the timed upload is not billed for it.
    await (await fetch(`${server.url}/api/v1/projects/${project.slug}/builds`)).arrayBuffer();
  } catch (error) {
    await server.stop();
    await removeDatabase();
    throw error;
  }
  return {
    url: server.url,
    project: project.slug,
    secret,
    pid: server.pid,
    async latestBuildDurationMs() {
      const build = await Build.findOne({ order: [['id', 'DESC']] });
      return build?.durationMs ?? null;
    },
    async remove() {
      await server.stop();
      await removeDatabase();
    }
  };
}

/**
 * A real Orientry server for the API tests: the production build (`node build`, built first when
 * stale) on a free port with a throw-away data folder and database. The test process opens the
 * same database (the SQLite file, WAL lets both in, or in the PostgreSQL pass a fresh PostgreSQL
 * database) to seed projects, people and tokens and to count rows.
 */
import type { ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { hashPassword } from '$lib/server/auth/password';
import type { Database } from '$lib/server/db/instance';
import type { PostedBuild } from '../../cli/post-build';
import { Project, ProjectMembership, User } from '$lib/server/db/models';
import type { ProjectRole, UserRole } from '$lib/types/roles';
import * as apiTokens from '$lib/server/tokens/api-tokens';
import { openDatabaseUnderTest } from './helpers/database-under-test';
import { copyOfBuild, freePort, launchServer, ROOT, stopChild } from './helpers/server-process';

/** A running server with its data. */
export interface ApiTestServer {
  url: string;
  dataDir: string;
  database: Database;
  /** DATABASE_URL of the server's database, for more server processes on the same data. */
  databaseUrl: string;
  child: ChildProcess;
  /** Lines the server printed (stdout and stderr), for failure messages. */
  output: string[];
  /** Stops the server (SIGTERM) and waits for it to exit. */
  stop(): Promise<void>;
  /** Starts the server again on the same data (after a stop or a kill). */
  restart(): Promise<void>;
  /** Stops the server, closes the database and deletes the data folder. */
  remove(): Promise<void>;
}

/** Environment every test server gets on top of the caller's. */
const BASE_ENV = {
  NODE_ENV: 'production',
  // adapter-node refuses bodies over 512 KiB before any route runs; the route enforces its own limits.
  BODY_SIZE_LIMIT: 'Infinity',
  AUTH_SECRET: 'api-test-secret-that-is-at-least-32-characters-long'
};

/** Options of {@link startApiTestServer}. */
export interface ApiTestServerOptions {
  /** Folder the server runs in (default: the repository root); it serves `cli/dist/orientry.js` from there. */
  cwd?: string;
}

/**
 * Builds the app if needed, makes a data folder with a migrated database and starts the server.
 * @param env extra environment (e.g. small ORIENTRY_MAX_* limits).
 */
export async function startApiTestServer(
  env: Record<string, string> = {},
  options: ApiTestServerOptions = {}
): Promise<ApiTestServer> {
  const cwd = options.cwd ?? ROOT;
  const buildDir = await copyOfBuild('api-build');
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'orientry-api-'));
  const underTest = await openDatabaseUnderTest({ sqliteFile: path.join(dataDir, 'api.db') });
  const { database } = underTest;

  const port = await freePort();
  const url = `http://127.0.0.1:${port}`;
  const output: string[] = [];
  const serverEnv = {
    ...process.env,
    ...BASE_ENV,
    ...env,
    PORT: String(port),
    HOST: '127.0.0.1',
    ORIGIN: url,
    DATA_DIR: dataDir,
    DATABASE_URL: underTest.url
  };
  let child: ChildProcess;
  try {
    child = await launchServer({ buildDir, cwd, env: serverEnv, url, output });
  } catch (error) {
    await underTest.remove();
    fs.rmSync(dataDir, { recursive: true, force: true });
    fs.rmSync(buildDir, { recursive: true, force: true });
    throw error;
  }
  const server: ApiTestServer = {
    url,
    dataDir,
    database,
    databaseUrl: underTest.url,
    child,
    output,
    async stop() {
      await stopChild(server.child);
    },
    async restart() {
      await stopChild(server.child);
      server.child = await launchServer({ buildDir, cwd, env: serverEnv, url, output });
    },
    async remove() {
      await stopChild(server.child);
      await underTest.remove();
      fs.rmSync(dataDir, { recursive: true, force: true });
      fs.rmSync(buildDir, { recursive: true, force: true });
    }
  };
  return server;
}

/** A seeded person with their password. */
export interface SeededUser {
  id: number;
  email: string;
  password: string;
}

/** Creates a user with a password (bcrypt-hashed as the app does). */
export async function seedUser(email: string, role: UserRole = 'artist'): Promise<SeededUser> {
  const password = `pw-${email}`;
  const user = await User.create({
    email,
    name: email.split('@')[0],
    role,
    passwordHash: await hashPassword(password)
  });
  return { id: user.id, email, password };
}

/** Creates a project, with members, and a submit token; returns the project and the token's secret. */
export async function seedProject(
  slug: string,
  members: { user: SeededUser; role: ProjectRole }[] = [],
  baseBranch = 'main'
): Promise<{ project: Project; secret: string; tokenId: number }> {
  const project = await Project.create({ slug, name: slug.replace(/-/g, ' '), baseBranch });
  for (const { user, role } of members)
    await ProjectMembership.create({ projectId: project.id, userId: user.id, role });
  const token = await apiTokens.create(project.id, 'CI', null);
  return { project, secret: token.secret, tokenId: token.id };
}

/**
 * Signs in through the sign-in form like a browser and returns the Cookie header to send with
 * later requests.
 */
export async function signIn(server: ApiTestServer, user: SeededUser): Promise<string> {
  const response = await fetch(`${server.url}/signin`, {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded', origin: server.url },
    body: new URLSearchParams({ email: user.email, password: user.password, redirectTo: '/' })
  });
  const cookies = response.headers
    .getSetCookie()
    .map((cookie) => cookie.split(';')[0])
    .filter((pair) => pair.includes('session-token=') && !pair.endsWith('='));
  if (cookies.length === 0) {
    throw new Error(`Sign-in as ${user.email} failed (status ${response.status}): ${await response.text()}`);
  }
  return cookies.join('; ');
}

/** A file of a build upload: its relative path and bytes. */
export interface UploadFile {
  path: string;
  bytes: Uint8Array | string;
}

/**
 * The body of the upload route's 201/200 answer: the build as the CLI reads it (its zod schema in
 * cli/post-build.ts), plus the stored time.
 */
export interface BuildAnswer {
  build: PostedBuild['build'] & { createdAt: string };
}

/** Options of {@link postBuild}. */
export interface PostBuildOptions {
  /** Authorization header value; default `Bearer <secret>`. Null sends none. */
  authorization?: string | null;
  /** The meta part as text (for malformed meta); default JSON of `meta`. */
  metaText?: string;
  /** Leave the meta part out. */
  omitMeta?: boolean;
  /** Extra headers. */
  headers?: Record<string, string>;
}

/**
 * Posts a build as the CLI does: multipart with `file` parts named by relative path and a `meta`
 * JSON part, with the Origin header SvelteKit requires on multipart posts.
 */
export async function postBuild(
  server: ApiTestServer,
  slug: string,
  secret: string,
  files: readonly UploadFile[],
  meta: Record<string, unknown> = { branch: 'main' },
  options: PostBuildOptions = {}
): Promise<Response> {
  const form = new FormData();
  if (!options.omitMeta) form.append('meta', options.metaText ?? JSON.stringify(meta));
  for (const file of files) form.append('file', new Blob([file.bytes as BlobPart]), file.path);
  const authorization = options.authorization === undefined ? `Bearer ${secret}` : options.authorization;
  return fetch(`${server.url}/api/v1/projects/${slug}/builds`, {
    method: 'POST',
    body: form,
    headers: {
      origin: server.url,
      accept: 'application/json',
      ...(authorization === null ? {} : { authorization }),
      ...options.headers
    }
  });
}

/** Row counts of every table a build writes, to show that a refused upload wrote nothing. */
export async function countBuildRows(database: Database): Promise<Record<string, number>> {
  const counts: Record<string, number> = {};
  for (const table of ['builds', 'assets', 'findings', 'asset_side_files']) {
    const [rows] = await database.sequelize.query(`SELECT COUNT(*) AS n FROM ${table}`);
    counts[table] = Number((rows as { n: number }[])[0].n);
  }
  return counts;
}

/** Names of the upload folders left in the data folder (none once every request has ended). */
export function listUploadFolders(server: ApiTestServer): string[] {
  const root = path.join(server.dataDir, 'uploads');
  return fs.existsSync(root) ? fs.readdirSync(root) : [];
}

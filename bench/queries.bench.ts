/**
 * Query benchmark: how fast the pages and API routes people open every day answer on a large
 * database, and how many submissions one server takes per minute, on SQLite and on PostgreSQL.
 *
 * For each database (SQLite always; PostgreSQL when BENCH_POSTGRES_URL or TEST_POSTGRES_URL names
 * a server whose user may create databases):
 * 1. seeds a fresh database with 1,000 builds of 200 assets each and 50,000 findings
 *    (bench/support/build-history.ts, bulk inserts through the models);
 * 2. starts the production server on it, signs in as a project viewer and times requests one
 *    after another (each after warm-ups), reading the whole answer:
 *    - the build report page `/projects/tidewatch/builds/{id}` for builds across the history,
 *    - `/api/v1/projects/tidewatch/builds/{id}/findings` for the same builds,
 *    - `/api/v1/projects/tidewatch/trends` (the newest 200 main builds, by severity and rule),
 *    - the trends page `/projects/tidewatch/trends` (regressions of the last 30 days);
 *    and reports the 95th percentile (target: under 200 ms each) and the median;
 * 3. runs 4 CLI clients at once (`node cli/dist/orientry.js submit`), each submitting 5 builds of
 *    50 small GLBs with new contents and its own idempotency keys, and reports submissions per
 *    minute over the whole run.
 * Prints a table per database and markdown for README. `npm run bench -- queries` runs it alone.
 */
import { spawn, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import { cpus, loadavg } from 'node:os';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { openDatabase } from '$lib/server/db/instance';
import { migrate } from '$lib/server/db/migrate';
import {
  benchPostgresUrl,
  createPostgresBenchDatabase,
  createSqliteBenchDatabase,
  type BenchDatabase
} from './support/bench-database';
import { seedBuildHistory, type SeededHistory } from './support/build-history';
import { formatMarkdownTable, formatTable, type BenchRow } from './support/measure';
import { copyBuild, signIn, startOrientryServer, type OrientryServer } from './support/orientry-server';
import { percentile } from './support/percentiles';
import { writeSmallAssets } from './support/small-assets';

const ROOT = process.cwd();
const CLI = path.join(ROOT, 'cli', 'dist', 'orientry.js');
const HISTORY = { builds: 1_000, assetsPerBuild: 200, findings: 50_000 };
const TARGET_P95_MS = 200;
const WARMUP_REQUESTS = 5;
const TIMED_REQUESTS = 100;
const CLIENTS = 4;
const SUBMISSIONS_PER_CLIENT = 5;
const ASSETS_PER_SUBMISSION = 50;
const ASSETS_ROOT = path.join(ROOT, 'bench-output', 'query-bench-assets');

await main();

async function main(): Promise<void> {
  process.stderr.write('Building the CLI, and the app when it is stale...\n');
  run(process.execPath, [path.join(ROOT, 'cli', 'build.js')]);
  const { ensureBuild } = (await import(pathToFileURL(path.join(ROOT, 'scripts', 'ensure-build.js')).href)) as {
    ensureBuild: () => boolean;
  };
  ensureBuild();
  const buildDir = copyBuild(ROOT);
  const postgresUrl = benchPostgresUrl();
  if (!postgresUrl) {
    process.stderr.write('No BENCH_POSTGRES_URL or TEST_POSTGRES_URL: benching SQLite only.\n');
  }
  const machine = `Node ${process.version}, ${cpus().length} × ${cpus()[0]?.model ?? 'CPU'}`;
  const markdown: string[] = [];
  try {
    const targets: (() => Promise<BenchDatabase>)[] = [async () => createSqliteBenchDatabase()];
    if (postgresUrl) targets.push(() => createPostgresBenchDatabase(postgresUrl));
    for (const createDatabase of targets) {
      const database = await createDatabase();
      try {
        const rows = await benchDatabase(database, buildDir);
        const title =
          `Orientry on ${database.label}: ${HISTORY.builds.toLocaleString('en-US')} builds × ` +
          `${HISTORY.assetsPerBuild} assets, ${HISTORY.findings.toLocaleString('en-US')} findings ` +
          `(${machine}, load average ${loadavg()[0].toFixed(1)})`;
        process.stdout.write(`${formatTable(title, rows)}\n\n`);
        markdown.push(`**${database.label}**\n\n${formatMarkdownTable(rows)}`);
      } finally {
        await database.drop();
      }
    }
  } finally {
    fs.rmSync(buildDir, { recursive: true, force: true });
    fs.rmSync(ASSETS_ROOT, { recursive: true, force: true });
  }
  process.stdout.write(`Markdown for README:\n\n${markdown.join('\n\n')}\n`);
}

async function benchDatabase(target: BenchDatabase, buildDir: string): Promise<BenchRow[]> {
  process.stderr.write(`${target.label}: migrating and seeding the history...\n`);
  const seedStarted = Date.now();
  const database = openDatabase(target.location);
  let history: SeededHistory;
  try {
    await migrate(database.sequelize);
    history = await seedBuildHistory(database, HISTORY);
  } finally {
    await database.sequelize.close();
  }
  const seedSeconds = (Date.now() - seedStarted) / 1000;
  process.stderr.write(`${target.label}: seeded in ${seedSeconds.toFixed(0)} s; starting the server...\n`);

  const server = await startOrientryServer(ROOT, buildDir, target.url);
  try {
    const cookie = await signIn(server, history.viewer.email, history.viewer.password);
    const slug = history.projectSlug;
    // Builds spread over the whole history, newest first: what people open most.
    const buildIds = Array.from(
      { length: TIMED_REQUESTS },
      (_, index) =>
        history.buildIds[history.buildIds.length - 1 - Math.floor((index * history.buildIds.length) / TIMED_REQUESTS)]
    );
    const routes: { name: string; pathOf: (index: number) => string }[] = [
      { name: 'Build report page', pathOf: (index) => `/projects/${slug}/builds/${buildIds[index]}` },
      {
        name: 'Findings API (first page)',
        pathOf: (index) => `/api/v1/projects/${slug}/builds/${buildIds[index]}/findings`
      },
      { name: 'Trends API (main, newest 200 builds)', pathOf: () => `/api/v1/projects/${slug}/trends` },
      { name: 'Trends page (last 30 days)', pathOf: () => `/projects/${slug}/trends` }
    ];
    const rows: BenchRow[] = [{ measure: 'Seeding the history (bulk inserts)', value: `${seedSeconds.toFixed(0)} s` }];
    for (const route of routes) {
      process.stderr.write(`${target.label}: timing ${route.name}...\n`);
      const times = await timeRoute(server, cookie, route.pathOf);
      const p95 = percentile(times, 95);
      rows.push({
        measure: `${route.name}: p95 (median)`,
        value: `${p95.toFixed(0)} ms (${percentile(times, 50).toFixed(0)} ms)`,
        target: `< ${TARGET_P95_MS} ms`,
        isMet: p95 < TARGET_P95_MS
      });
    }
    process.stderr.write(`${target.label}: ${CLIENTS} CLI clients submitting...\n`);
    const submissions = await benchSubmissions(server, history, target.label);
    rows.push(
      {
        measure: `Submissions per minute, ${CLIENTS} CLI clients at once (${ASSETS_PER_SUBMISSION} small GLBs each)`,
        value: submissions.perMinute.toFixed(0)
      },
      { measure: '  one submission, CLI start to answer: median (p95)', value: submissions.latency }
    );
    return rows;
  } finally {
    await server.stop();
  }
}

/** Wall times in ms of {@link TIMED_REQUESTS} requests, one at a time, after warm-ups. */
async function timeRoute(server: OrientryServer, cookie: string, pathOf: (index: number) => string): Promise<number[]> {
  const fetchOnce = async (requestPath: string) => {
    const response = await fetch(`${server.url}${requestPath}`, { headers: { cookie, accept: 'text/html, */*' } });
    const body = await response.text();
    if (response.status !== 200) {
      throw new Error(`${requestPath} answered ${response.status}: ${body.slice(0, 300)}\n${server.output.join('')}`);
    }
  };
  for (let index = 0; index < WARMUP_REQUESTS; index++) await fetchOnce(pathOf(index));
  const times: number[] = [];
  for (let index = 0; index < TIMED_REQUESTS; index++) {
    const started = process.hrtime.bigint();
    await fetchOnce(pathOf(index));
    times.push(Number(process.hrtime.bigint() - started) / 1e6);
  }
  return times;
}

/** Runs the concurrent CLI clients; submissions per minute over the whole run, and one submission's latency. */
async function benchSubmissions(
  server: OrientryServer,
  history: SeededHistory,
  label: string
): Promise<{ perMinute: number; latency: string }> {
  const folderOf = (client: number, round: number) => path.join(ASSETS_ROOT, `client-${client}`, `round-${round}`);
  for (let client = 0; client < CLIENTS; client++) {
    for (let round = 0; round <= SUBMISSIONS_PER_CLIENT; round++) {
      await writeSmallAssets(folderOf(client, round), ASSETS_PER_SUBMISSION, client * 100 + round);
    }
  }
  const submit = (client: number, round: number) =>
    runCli(
      [
        'submit',
        folderOf(client, round),
        '--root',
        folderOf(client, round),
        '--server',
        server.url,
        '--project',
        history.projectSlug,
        '--branch',
        `bench/client-${client}`,
        '--commit',
        (client * 1000 + round + 0xabc0000).toString(16),
        '--idempotency-key',
        `bench-${label}-${process.pid}-${client}-${round}`,
        '--retries',
        '0'
      ],
      history.secret
    );
  // Round 0 of client 0, untimed: loads the upload route and warms the server.
  await submit(0, 0);
  const latencies: number[] = [];
  const started = process.hrtime.bigint();
  await Promise.all(
    Array.from({ length: CLIENTS }, async (_, client) => {
      for (let round = 1; round <= SUBMISSIONS_PER_CLIENT; round++) latencies.push(await submit(client, round));
    })
  );
  const totalMs = Number(process.hrtime.bigint() - started) / 1e6;
  return {
    perMinute: (CLIENTS * SUBMISSIONS_PER_CLIENT * 60_000) / totalMs,
    latency: `${(percentile(latencies, 50) / 1000).toFixed(2)} s (${(percentile(latencies, 95) / 1000).toFixed(2)} s)`
  };
}

/** Runs one `orientry submit` and returns its wall time in ms; exit 0 or 1 (a gate verdict) is success. */
async function runCli(args: string[], token: string): Promise<number> {
  const started = process.hrtime.bigint();
  const child = spawn(process.execPath, [CLI, ...args], {
    cwd: ROOT,
    env: { ...process.env, NO_COLOR: '1', ORIENTRY_TOKEN: token },
    stdio: ['ignore', 'pipe', 'pipe']
  });
  let output = '';
  for (const stream of [child.stdout, child.stderr]) stream.setEncoding('utf8').on('data', (text) => (output += text));
  const status = await new Promise<number | null>((resolve, reject) => {
    child.once('error', reject);
    child.once('close', resolve);
  });
  if (status !== 0 && status !== 1) throw new Error(`orientry ${args.join(' ')} exited ${status}:\n${output}`);
  return Number(process.hrtime.bigint() - started) / 1e6;
}

function run(command: string, args: string[]): void {
  const result = spawnSync(command, args, { cwd: ROOT, stdio: ['ignore', 'inherit', 'inherit'] });
  if (result.status !== 0) throw new Error(`${command} ${args.join(' ')} exited ${result.status}`);
}

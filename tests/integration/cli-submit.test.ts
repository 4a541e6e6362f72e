/**
 * `orientry submit` end to end: the bundled CLI (node cli/dist/orientry.js) against the real
 * server (production build, throw-away database and data folder), with assets built in code.
 */
import { execFileSync } from 'node:child_process';
import crypto from 'node:crypto';
import fs from 'node:fs';
import http from 'node:http';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Asset, Build } from '$lib/server/db/models';
import {
  CLEAN_CHANNEL,
  createRotationDocument,
  FLIPPED_CUBIC_CHANNEL,
  writeGlb,
  writeGltf
} from '../../cli/testing/rotation-assets';
import { buildCli, runCliAsync, type CliRun } from '../../cli/testing/run-cli';
import { seedProject, startApiTestServer, type ApiTestServer } from './api-test-server';
import { freePort } from './helpers/server-process';

let server: ApiTestServer;
let secret: string;
let work: string;

beforeAll(async () => {
  buildCli();
  server = await startApiTestServer();
  secret = (await seedProject('tidewatch')).secret;
  work = fs.mkdtempSync(path.join(os.tmpdir(), 'orientry-cli-submit-'));
  // Two versions of one asset folder: the keeper as .gltf + .bin, and a buoy as .glb.
  for (const [folder, keeper] of [
    ['clean', CLEAN_CHANNEL],
    ['flipped', FLIPPED_CUBIC_CHANNEL]
  ] as const) {
    await writeGltf(createRotationDocument([keeper]), path.join(work, folder, 'keeper/keeper.gltf'), 'keeper-data.bin');
    await writeGlb(createRotationDocument([CLEAN_CHANNEL]), path.join(work, folder, 'props/buoy.glb'));
  }
  fs.writeFileSync(path.join(work, 'notes.txt'), 'not an asset');
}, 600_000);

afterAll(async () => {
  await server?.remove();
  if (work) fs.rmSync(work, { recursive: true, force: true });
});

/** Runs `orientry submit <args> --server <server> --project tidewatch` with the project's token. */
function submit(args: string[], env: Record<string, string> = {}, serverUrl = server.url): Promise<CliRun> {
  return runCliAsync(['submit', ...args, '--server', serverUrl, '--project', 'tidewatch'], work, {
    env: { ORIENTRY_TOKEN: secret, ...env }
  });
}

/** The build id in the summary's `report:` line, which must point at the server's build page. */
function reportedBuildId(run: CliRun): number {
  const match = new RegExp(`report: ${server.url}/projects/tidewatch/builds/(\\d+)`).exec(run.stdout);
  expect(match, `no report URL in:\n${run.stdout}\n${run.stderr}`).not.toBeNull();
  return Number(match![1]);
}

describe('orientry submit', () => {
  let featureBuildId: number;

  it('passes (exit 0) on the first build on main and uploads each .gltf with its .bin', async () => {
    const run = await submit(['clean', '--root', 'clean', '--commit', 'aaaa1111', '--branch', 'main', '--label', '#1']);
    expect(run.status, run.stderr).toBe(0);
    expect(run.stdout).toContain('gate passed');
    expect(run.stdout).toContain('no baseline build yet');
    const build = await Build.findByPk(reportedBuildId(run));
    expect(build).toMatchObject({ branch: 'main', commitSha: 'aaaa1111', label: '#1', verdict: 'pass' });
    const assets = await Asset.findAll({ where: { buildId: build!.id }, order: [['path', 'ASC']] });
    expect(assets.map((asset) => asset.path)).toEqual(['keeper/keeper.gltf', 'props/buoy.glb']);
    // The server records the side file the .gltf read, with the digest of what it received.
    const [sideFiles] = await server.database.sequelize.query(
      'SELECT "path", "contentHash" FROM "asset_side_files" WHERE "assetId" = ?',
      { replacements: [assets[0].id] }
    );
    const binBytes = fs.readFileSync(path.join(work, 'clean/keeper/keeper-data.bin'));
    expect(sideFiles).toEqual([
      { path: 'keeper-data.bin', contentHash: crypto.createHash('sha256').update(binBytes).digest('hex') }
    ]);
  });

  it('fails (exit 1) on a feature branch with a new CUBICSPLINE hemisphere flip and prints the report URL', async () => {
    const run = await submit([
      'flipped',
      '--root',
      'flipped',
      '--commit',
      'bbbb2222',
      '--branch',
      'feature/lantern-arm',
      '--label',
      '#2'
    ]);
    expect(run.status, run.stderr).toBe(1);
    expect(run.stdout).toContain('gate FAILED');
    expect(run.stdout).toMatch(/reason: .*hemisphere-jump in keeper\/keeper\.gltf/);
    featureBuildId = reportedBuildId(run);
    const build = await Build.findByPk(featureBuildId);
    expect(build?.verdict).toBe('fail');
    expect(build?.newCount).toBeGreaterThan(0);
  });

  it('answers the same build for a repeated submission with the same derived key, storing nothing new', async () => {
    const before = await Build.count();
    const run = await submit([
      'flipped',
      '--root',
      'flipped',
      '--commit',
      'bbbb2222',
      '--branch',
      'feature/lantern-arm',
      '--label',
      '#2'
    ]);
    expect(run.status).toBe(1);
    expect(reportedBuildId(run)).toBe(featureBuildId);
    expect(run.stdout).toContain('already submitted with this idempotency key');
    expect(await Build.count()).toBe(before);
  });

  it("writes the server's SARIF report with --format sarif --output, the summary staying on stdout", async () => {
    const run = await submit([
      'flipped',
      '--root',
      'flipped',
      '--commit',
      'ffff6666',
      '--branch',
      'feature/lantern-arm',
      '--format',
      'sarif',
      '--output',
      'reports/build.sarif'
    ]);
    expect(run.status, run.stderr).toBe(1);
    expect(run.stdout).toContain('gate FAILED');
    const sarif = JSON.parse(fs.readFileSync(path.join(work, 'reports/build.sarif'), 'utf8')) as {
      version: string;
      runs: {
        tool: { driver: { name: string } };
        results: { ruleId: string; baselineState?: string }[];
        properties: { build?: { id: number; verdict: string } };
      }[];
    };
    // SARIF 2.1.0 (OASIS): a log names its version and holds runs, each with tool.driver and results.
    expect(sarif.version).toBe('2.1.0');
    expect(sarif.runs[0].tool.driver.name.toLowerCase()).toContain('orientry');
    expect(sarif.runs[0].results.map((result) => result.ruleId)).toContain('hemisphere-jump');
    // The server's report, not a local re-lint: it names the stored build and each result's baseline state.
    expect(run.stderr).not.toContain('rendered on this machine');
    expect(sarif.runs[0].properties.build).toMatchObject({ id: reportedBuildId(run), verdict: 'fail' });
    expect(sarif.runs[0].results.every((result) => result.baselineState === 'new')).toBe(true);
    const fromServer = await fetch(
      `${server.url}/api/v1/projects/tidewatch/builds/${reportedBuildId(run)}/report.sarif`,
      { headers: { authorization: `Bearer ${secret}` } }
    );
    expect(fs.readFileSync(path.join(work, 'reports/build.sarif'), 'utf8')).toBe(await fromServer.text());
  });

  it('writes the JSON report to stdout and the summary to stderr without --output', async () => {
    const run = await submit([
      'clean',
      '--root',
      'clean',
      '--commit',
      'aaaa1111',
      '--branch',
      'main',
      '--format',
      'json'
    ]);
    expect(run.status, run.stderr).toBe(0);
    const report = JSON.parse(run.stdout) as { schema: string; build?: { id: number }; assets: { path: string }[] };
    expect(report.schema).toBe('orientry.lint-report');
    expect(run.stderr).not.toContain('rendered on this machine');
    expect(report.build?.id).toBeGreaterThan(0);
    expect(report.assets.map((asset) => asset.path)).toEqual(['keeper/keeper.gltf', 'props/buoy.glb']);
    expect(run.stderr).toContain('gate passed');
  });

  it('reports the findings as fixed when a later build no longer has them', async () => {
    // Main gets the flip first (failing), so the fix below is compared with a baseline that has it.
    const broken = await submit(['flipped', '--root', 'flipped', '--commit', 'cccc3333', '--branch', 'main']);
    expect(broken.status).toBe(1);
    const fixed = await submit(['clean', '--root', 'clean', '--commit', 'dddd4444', '--branch', 'fix/lantern-arm']);
    expect(fixed.status, fixed.stderr).toBe(0);
    const build = await Build.findByPk(reportedBuildId(fixed));
    expect(build?.fixedCount).toBeGreaterThan(0);
    expect(fixed.stdout).toMatch(
      new RegExp(`against build ${reportedBuildId(broken)}: 0 new, 0 unchanged, ${build!.fixedCount} fixed`)
    );
  });

  it('takes commit, branch, label and job link from the CI variables when no flag names them', async () => {
    const run = await submit(['clean', '--root', 'clean'], {
      GITHUB_ACTIONS: 'true',
      GITHUB_SHA: 'eeee5555eeee5555eeee5555eeee5555eeee5555',
      GITHUB_REF_NAME: 'release/1.0',
      GITHUB_RUN_NUMBER: '57',
      GITHUB_SERVER_URL: 'https://github.example',
      GITHUB_REPOSITORY: 'lanternfish/tidewatch',
      GITHUB_RUN_ID: '9001'
    });
    expect(run.status, run.stderr).toBe(0);
    expect(run.stderr).toContain('details from GitHub Actions');
    const build = await Build.findByPk(reportedBuildId(run));
    expect(build).toMatchObject({
      branch: 'release/1.0',
      commitSha: 'eeee5555eeee5555eeee5555eeee5555eeee5555',
      label: '#57',
      ciJobUrl: 'https://github.example/lanternfish/tidewatch/actions/runs/9001'
    });
  });

  it('takes commit and branch from git in the working folder outside CI', async () => {
    const checkout = path.join(work, 'checkout');
    fs.cpSync(path.join(work, 'clean'), checkout, { recursive: true });
    const git = (...args: string[]) =>
      execFileSync('git', args, {
        cwd: checkout,
        encoding: 'utf8',
        env: {
          ...process.env,
          GIT_AUTHOR_NAME: 'Tidewatch CI',
          GIT_AUTHOR_EMAIL: 'ci@lanternfish.example',
          GIT_COMMITTER_NAME: 'Tidewatch CI',
          GIT_COMMITTER_EMAIL: 'ci@lanternfish.example'
        }
      }).trim();
    git('init', '--quiet', '--initial-branch', 'art/buoy');
    git('add', '.');
    git('commit', '--quiet', '-m', 'Buoy');
    const run = await runCliAsync(['submit', '.', '--server', server.url, '--project', 'tidewatch'], checkout, {
      env: { ORIENTRY_TOKEN: secret }
    });
    expect(run.status, run.stderr).toBe(0);
    const build = await Build.findByPk(reportedBuildId(run));
    expect(build).toMatchObject({ branch: 'art/buoy', commitSha: git('rev-parse', 'HEAD') });
  });

  it('retries after an answer that was lost, and the server answers the retry with the build it stored', async () => {
    // A proxy that passes every request on, but answers the first one 503 once the server has
    // stored it: the first attempt's answer is lost. The retry sends the same files and details,
    // so the server derives the same key and answers with the stored build.
    const metas: unknown[] = [];
    const headerKeys: (string | undefined)[] = [];
    let requests = 0;
    const proxy = http.createServer((request, response) => {
      const attempt = ++requests;
      const chunks: Buffer[] = [];
      request.on('data', (chunk: Buffer) => chunks.push(chunk));
      request.on('end', () => {
        const body = Buffer.concat(chunks);
        metas.push(
          JSON.parse(/name="meta"\r\nContent-Type: [^\r]+\r\n\r\n(.*?)\r\n--/s.exec(body.toString('utf8'))![1])
        );
        headerKeys.push(request.headers['idempotency-key'] as string | undefined);
        const target = new URL(request.url!, server.url);
        const forwarded = http.request(target, {
          method: request.method,
          headers: { ...request.headers, host: target.host, origin: server.url }
        });
        forwarded.on('response', (answer) => {
          if (attempt === 1) {
            answer.resume();
            response.writeHead(503, { 'content-type': 'application/json', 'retry-after': '0' });
            response.end(JSON.stringify({ error: { code: 'server.busy', message: 'Restarting.' } }));
            return;
          }
          response.writeHead(answer.statusCode!, answer.headers);
          answer.pipe(response);
        });
        forwarded.end(body);
      });
    });
    await new Promise<void>((resolve) => proxy.listen(0, '127.0.0.1', resolve));
    const proxyUrl = `http://127.0.0.1:${(proxy.address() as net.AddressInfo).port}`;
    try {
      const before = await Build.count();
      const run = await submit(
        ['clean', '--root', 'clean', '--commit', 'abab7777', '--branch', 'main', '--retry-delay', '0.01'],
        {},
        proxyUrl
      );
      expect(run.status, run.stderr).toBe(0);
      expect(run.stderr).toContain('attempt 1 of 5 failed (HTTP 503 server.busy: Restarting.)');
      expect(run.stdout).toContain('already submitted with this idempotency key');
      // meta comes first and asks the server to derive the key; no key travels in a header.
      expect(metas).toHaveLength(2);
      expect(metas[0]).toMatchObject({ branch: 'main', commit: 'abab7777', deriveIdempotencyKey: true });
      expect(metas[1]).toEqual(metas[0]);
      expect(headerKeys).toEqual([undefined, undefined]);
      expect(await Build.count()).toBe(before + 1);
      const stored = await Build.findByPk(reportedBuildId(run));
      expect(stored?.idempotencyKey).toMatch(/^cli1-[0-9a-f]{64}$/);
    } finally {
      await new Promise((resolve) => proxy.close(resolve));
    }
  });

  it('exits 2 with one line naming ORIENTRY_TOKEN when no token is set', async () => {
    const run = await runCliAsync(
      ['submit', 'clean', '--server', server.url, '--project', 'tidewatch', '--commit', 'aaaa1111', '--branch', 'main'],
      work
    );
    expect(run.status).toBe(2);
    expect(run.stderr.trimEnd().split('\n')).toHaveLength(1);
    expect(run.stderr).toContain('set ORIENTRY_TOKEN');
  });

  it("exits 2 with the server's reason when it refuses the upload's content", async () => {
    const run = await submit(['notes.txt', '--commit', 'aaaa1111', '--branch', 'main']);
    expect(run.status).toBe(2);
    expect(run.stderr).toContain('HTTP 400 upload.no-assets');
  });

  it("exits 3 with the server's code and message for a wrong token", async () => {
    const run = await submit(['clean', '--commit', 'aaaa1111', '--branch', 'main'], {
      ORIENTRY_TOKEN: `${secret.slice(0, -4)}zzzz`
    });
    expect(run.status).toBe(3);
    expect(run.stderr).toMatch(/^orientry submit: the server refused the upload \(HTTP 401 auth\.token-invalid\): /m);
    expect(run.stderr.trimEnd().split('\n').at(-1)).toContain('auth.token-invalid');
  });

  it('exits 3 with the refusal, not a broken pipe, when a wrong token meets a large upload', async () => {
    fs.mkdirSync(path.join(work, 'large'), { recursive: true });
    fs.writeFileSync(path.join(work, 'large/cliff.glb'), crypto.randomBytes(48 * 1024 * 1024));
    const run = await submit(['large', '--commit', 'aaaa1111', '--branch', 'main', '--retries', '0'], {
      ORIENTRY_TOKEN: `${secret.slice(0, -4)}zzzz`
    });
    expect(run.stderr).toContain('auth.token-invalid');
    expect(run.status).toBe(3);
  });

  it('exits 3 for an unknown project', async () => {
    const run = await runCliAsync(
      [
        'submit',
        'clean',
        '--server',
        server.url,
        '--project',
        'no-such-game',
        '--commit',
        'aaaa1111',
        '--branch',
        'main'
      ],
      work,
      { env: { ORIENTRY_TOKEN: secret } }
    );
    expect(run.status).toBe(3);
    expect(run.stderr).toContain('HTTP 404 project.not-found');
  });

  it('exits 3 after its retries when nothing listens at the server address', async () => {
    const port = await freePort();
    const run = await submit(
      ['clean', '--commit', 'aaaa1111', '--branch', 'main', '--retries', '1', '--retry-delay', '0.01'],
      {},
      `http://127.0.0.1:${port}`
    );
    expect(run.status).toBe(3);
    expect(run.stderr).toContain('attempt 1 of 2 failed');
    expect(run.stderr).toContain(
      `POST http://127.0.0.1:${port}/api/v1/projects/tidewatch/builds: gave up after 2 attempts`
    );
    expect(run.stderr).toContain('ECONNREFUSED');
  });
});

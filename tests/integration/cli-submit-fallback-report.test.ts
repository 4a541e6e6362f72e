/**
 * `orientry submit --format json` against a server that stores the build but does not give its
 * report (an older server, or a proxy that blocks the route): the bundled CLI lints the files on
 * this machine instead, says so on stderr, and still exits with the server's verdict. This is the
 * one submit path that loads the lint engine (see cli/main.ts), so it runs the real bundle.
 */
import fs from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, expect, it } from 'vitest';
import {
  CLEAN_CHANNEL,
  createRotationDocument,
  FLIPPED_CUBIC_CHANNEL,
  writeGlb
} from '../../cli/testing/rotation-assets';
import { buildCli, runCliAsync } from '../../cli/testing/run-cli';

let work: string;
let server: http.Server;
let serverUrl: string;

/** A build answer of the shape post-build.ts validates. */
const storedBuild = {
  build: {
    id: 7,
    branch: 'main',
    commit: 'aaaa1111',
    label: null,
    verdict: 'fail',
    verdictReason: '1 new error',
    counts: { error: 1, warning: 0, info: 0, new: 1, unchanged: 0, fixed: 0, waived: 0 },
    assetCount: 2,
    baselineBuildId: null,
    reportUrl: 'http://orientry.invalid/projects/tidewatch/builds/7'
  }
};

beforeAll(async () => {
  buildCli();
  work = fs.mkdtempSync(path.join(os.tmpdir(), 'orientry-cli-fallback-'));
  await writeGlb(createRotationDocument([FLIPPED_CUBIC_CHANNEL]), path.join(work, 'keeper.glb'));
  await writeGlb(createRotationDocument([CLEAN_CHANNEL]), path.join(work, 'buoy.glb'));
  server = http.createServer((request, response) => {
    request.resume();
    request.on('end', () => {
      const isUpload = request.method === 'POST' && request.url === '/api/v1/projects/tidewatch/builds';
      response.writeHead(isUpload ? 201 : 404, { 'content-type': 'application/json' });
      response.end(JSON.stringify(isUpload ? storedBuild : { error: { code: 'not-found', message: 'Not found.' } }));
    });
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  serverUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
}, 120_000);

afterAll(async () => {
  await new Promise((resolve) => server?.close(resolve));
  if (work) fs.rmSync(work, { recursive: true, force: true });
});

it('renders the report on this machine when the server gives none, and exits with the server verdict', async () => {
  const run = await runCliAsync(
    [
      'submit',
      '.',
      '--server',
      serverUrl,
      '--project',
      'tidewatch',
      '--commit',
      'aaaa1111',
      '--branch',
      'main',
      '--format',
      'json',
      '--retries',
      '0'
    ],
    work,
    { env: { ORIENTRY_TOKEN: 'orientry_test_token' } }
  );
  expect(run.stderr).toContain('HTTP 404 not-found');
  expect(run.stderr).toContain('rendered on this machine with the built-in policy');
  // The server's verdict (fail), not the local lint's, decides the exit code: 1.
  expect(run.status, run.stderr).toBe(1);
  const report = JSON.parse(run.stdout) as { assets: { path: string; findings: { rule: string }[] }[] };
  const keeper = report.assets.find((asset) => asset.path === 'keeper.glb');
  // FLIPPED_CUBIC_CHANNEL holds a sign flip between CUBICSPLINE keys: an error under the default policy.
  expect(keeper?.findings.map((finding) => finding.rule)).toContain('hemisphere-jump');
  expect(report.assets.find((asset) => asset.path === 'buoy.glb')?.findings).toEqual([]);
});

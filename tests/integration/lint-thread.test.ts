/**
 * The built server lints uploads on its lint thread (src/lib/server/ingest/lint-thread.ts), and
 * what the thread finds is exactly what the library finds on the caller's thread: every stored
 * finding of a build matches `lintAsset` run here on the same bytes.
 * Assets: the glTF 2.0 sample models in tests/fixtures/reference (see ATTRIBUTION.md), a clip
 * with a zero key, one with backwards key times, and a file that is no glTF at all.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { lintAsset } from '$lib/lint/lint-asset';
import { parsePolicy } from '$lib/lint/policy';
import { FindingRecord } from '$lib/server/db/models';
import { diverGlb } from './api-fixtures';
import { postBuild, seedProject, startApiTestServer, type ApiTestServer, type UploadFile } from './api-test-server';

const REFERENCE = path.join(process.cwd(), 'tests', 'fixtures', 'reference');

let server: ApiTestServer;
let secret: string;

beforeAll(async () => {
  server = await startApiTestServer();
  secret = (await seedProject('tidewatch')).secret;
});
afterAll(async () => server?.remove());

async function uploadFiles(): Promise<UploadFile[]> {
  const reference = ['RiggedFigure.gltf', 'SimpleSkin.gltf', 'AnimatedTriangle.gltf'].map((name) => ({
    path: `reference/${name}`,
    bytes: new Uint8Array(fs.readFileSync(path.join(REFERENCE, name)))
  }));
  return [
    ...reference,
    { path: 'chars/zero-key.glb', bytes: await diverGlb({ defect: 'zero-key' }) },
    { path: 'chars/backwards.glb', bytes: await diverGlb({ defect: 'backwards-time' }) },
    { path: 'props/not-gltf.glb', bytes: 'plain text, not a GLB' }
  ];
}

/** What identifies a finding, in a fixed order. */
function keysOf(findings: readonly { rule: string; severity: string; fingerprint: string }[]): string[] {
  return findings.map((finding) => `${finding.rule} ${finding.severity} ${finding.fingerprint}`).sort();
}

describe('the lint thread of the built server', () => {
  it('is what the server reports using: one per core, at most 4, by default', async () => {
    const health = await (await fetch(`${server.url}/api/health`)).json();
    expect(health.lintThreads).toBe(Math.min(4, os.availableParallelism()));
  });

  it('stores for every asset the findings the library gives on this thread', async () => {
    const files = await uploadFiles();
    const response = await postBuild(server, 'tidewatch', secret, files, { branch: 'main' });
    const text = await response.text();
    expect(response.status, text).toBe(201);
    const buildId = (JSON.parse(text) as { build: { id: number } }).build.id;
    const stored = await FindingRecord.findAll({ where: { buildId } });

    const policy = parsePolicy({});
    const expected = [];
    for (const file of files) {
      const bytes = typeof file.bytes === 'string' ? new TextEncoder().encode(file.bytes) : file.bytes;
      const readSideFile = async () => null;
      expected.push(...(await lintAsset({ path: file.path, bytes, readSideFile }, policy)).findings);
    }
    // The oracle is the library itself, run here; the assets make sure there is something to match.
    expect(expected.map((finding) => finding.rule)).toEqual(
      expect.arrayContaining(['not-a-rotation', 'key-times', 'asset-unreadable'])
    );
    expect(keysOf(stored.map((row) => row.get({ plain: true })))).toEqual(keysOf(expected));
  });
});

describe('ORIENTRY_LINT_THREADS=0', () => {
  it('makes the built server lint on the request thread', async () => {
    const onMain = await startApiTestServer({ ORIENTRY_LINT_THREADS: '0' });
    try {
      const health = await (await fetch(`${onMain.url}/api/health`)).json();
      expect(health.lintThreads).toBe(0);
    } finally {
      await onMain.remove();
    }
  });
});

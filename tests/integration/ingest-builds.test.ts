/**
 * Build ingestion through the real server: baselines, verdicts, waivers, fixed findings,
 * idempotency, .gltf side files and blob storage.
 */
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Asset, Build, FindingRecord, Waiver } from '$lib/server/db/models';
import { diverGlb, diverGltf } from './api-fixtures';
import {
  countBuildRows,
  listUploadFolders,
  postBuild,
  seedProject,
  startApiTestServer,
  type ApiTestServer,
  type UploadFile,
  type BuildAnswer
} from './api-test-server';

let server: ApiTestServer;
let secret: string;
let projectId: number;

beforeAll(async () => {
  server = await startApiTestServer();
  const seeded = await seedProject('tidewatch');
  secret = seeded.secret;
  projectId = seeded.project.id;
});
afterAll(async () => server?.remove());

/** The kelp diver (with a defect or clean) and the buoy as .gltf + .bin. */
async function buildFiles(defect: 'none' | 'zero-key' | 'backwards-time' = 'none'): Promise<UploadFile[]> {
  const buoy = await diverGltf({ jointName: 'Float', binName: 'buoy.bin' });
  return [
    { path: 'chars/kelp-diver.glb', bytes: await diverGlb({ defect }) },
    { path: 'props/buoy.gltf', bytes: buoy.gltf },
    { path: 'props/buoy.bin', bytes: buoy.bin }
  ];
}

async function submit(
  files: UploadFile[],
  meta: Record<string, unknown>
): Promise<{ status: number; body: BuildAnswer }> {
  const response = await postBuild(server, 'tidewatch', secret, files, meta);
  const body = (await response.json()) as BuildAnswer;
  return { status: response.status, body };
}

const zeroCounts = { error: 0, warning: 0, info: 0, new: 0, unchanged: 0, fixed: 0, waived: 0 };

describe('POST /api/v1/projects/{project}/builds', () => {
  let firstMainId: number;
  let featureFailId: number;

  it('stores the first build on main as a pass with no baseline', async () => {
    const { status, body } = await submit(await buildFiles(), {
      branch: 'main',
      commit: '3f2a9c1d',
      label: '#1480',
      ciJobUrl: 'https://ci.lanternfish.example/jobs/1480'
    });
    expect(status).toBe(201);
    expect(body.build).toMatchObject({
      verdict: 'pass',
      verdictReason: 'No new errors',
      counts: zeroCounts,
      assetCount: 2,
      baselineBuildId: null,
      branch: 'main'
    });
    expect(body.build.reportUrl).toBe(`${server.url}/projects/tidewatch/builds/${body.build.id}`);
    firstMainId = body.build.id;

    const stored = await Build.findByPk(firstMainId);
    expect(stored).toMatchObject({ commitSha: '3f2a9c1d', label: '#1480', projectId });
    const assets = await Asset.findAll({ where: { buildId: firstMainId }, order: [['path', 'ASC']] });
    // The .bin is a side file, not an asset of its own.
    expect(assets.map((asset) => asset.path)).toEqual(['chars/kelp-diver.glb', 'props/buoy.gltf']);
    expect(listUploadFolders(server)).toEqual([]);
  });

  it('stores every file once by content hash under blobs/', async () => {
    const files = await buildFiles();
    for (const file of files) {
      const sha256 = crypto.createHash('sha256').update(file.bytes).digest('hex');
      const blob = path.join(server.dataDir, 'blobs', sha256.slice(0, 2), sha256.slice(2));
      expect(fs.readFileSync(blob)).toEqual(Buffer.from(file.bytes));
    }
  });

  it('fails a feature-branch build that brings a new error, compared with the latest main build', async () => {
    const { status, body } = await submit(await buildFiles('zero-key'), { branch: 'feature/new-swim' });
    expect(status).toBe(201);
    expect(body.build).toMatchObject({
      verdict: 'fail',
      verdictReason: '1 new error: not-a-rotation in chars/kelp-diver.glb (/Diver/Hips at 1 s)',
      counts: { ...zeroCounts, error: 1, new: 1 },
      baselineBuildId: firstMainId
    });
    featureFailId = body.build.id;
    const findings = await FindingRecord.findAll({ where: { buildId: featureFailId } });
    expect(findings.map((f) => [f.rule, f.severity, f.status, f.assetPath, f.waived])).toEqual([
      ['not-a-rotation', 'error', 'new', 'chars/kelp-diver.glb', false]
    ]);
  });

  it('passes the same build once a lead approves a waiver for the finding', async () => {
    const [finding] = await FindingRecord.findAll({ where: { buildId: featureFailId } });
    const waiver = await Waiver.create({
      projectId,
      scope: 'fingerprint',
      fingerprint: finding.fingerprint,
      rule: null,
      assetPath: null,
      reason: 'The zero key is a placeholder the rig team replaces next sprint.',
      expiresAt: new Date(Date.now() + 7 * 24 * 3600 * 1000),
      status: 'approved',
      proposedById: null
    });
    const { body } = await submit(await buildFiles('zero-key'), { branch: 'feature/new-swim' });
    expect(body.build).toMatchObject({
      verdict: 'pass',
      verdictReason: 'No new errors (1 waived)',
      counts: { ...zeroCounts, waived: 1 }
    });
    const stored = await FindingRecord.findAll({ where: { buildId: body.build.id } });
    expect(stored.map((f) => [f.rule, f.status, f.waived, f.waiverId])).toEqual([
      ['not-a-rotation', 'new', true, waiver.id]
    ]);
    await waiver.update({ status: 'revoked' });
  });

  it('ignores an expired waiver', async () => {
    const [finding] = await FindingRecord.findAll({ where: { buildId: featureFailId } });
    const waiver = await Waiver.create({
      projectId,
      scope: 'rule-asset',
      fingerprint: null,
      rule: finding.rule,
      assetPath: finding.assetPath,
      reason: 'Temporary exception that has run out.',
      expiresAt: new Date(Date.now() - 1000),
      status: 'approved',
      proposedById: null
    });
    const { body } = await submit(await buildFiles('zero-key'), { branch: 'feature/new-swim' });
    expect(body.build.verdict).toBe('fail');
    await waiver.destroy();
  });

  let regressionId: number;

  it('compares a main build with its predecessor on main', async () => {
    const { body } = await submit(await buildFiles('backwards-time'), { branch: 'main', label: '#1481' });
    expect(body.build).toMatchObject({
      verdict: 'fail',
      counts: { ...zeroCounts, error: 1, new: 1 },
      baselineBuildId: firstMainId
    });
    expect(body.build.verdictReason).toMatch(
      /^1 new error: key-times in chars\/kelp-diver\.glb \(\/Diver\/Hips at 0\.5 s\)$/
    );
    regressionId = body.build.id;
  });

  it('keeps an error already in the baseline as unchanged, which does not fail the gate', async () => {
    const { body } = await submit(await buildFiles('backwards-time'), { branch: 'main', label: '#1482' });
    expect(body.build).toMatchObject({
      verdict: 'pass',
      verdictReason: 'No new errors (1 unchanged)',
      counts: { ...zeroCounts, error: 1, unchanged: 1 },
      baselineBuildId: regressionId
    });
    regressionId = body.build.id;
  });

  it('reports the baseline findings that are gone as fixed and stores them', async () => {
    const { body } = await submit(await buildFiles(), { branch: 'main', label: '#1483' });
    expect(body.build).toMatchObject({
      verdict: 'pass',
      verdictReason: 'No new errors (1 fixed)',
      counts: { ...zeroCounts, fixed: 1 },
      baselineBuildId: regressionId
    });
    const fixed = await FindingRecord.findAll({ where: { buildId: body.build.id } });
    expect(fixed.map((f) => [f.rule, f.status, f.assetPath])).toEqual([['key-times', 'fixed', 'chars/kelp-diver.glb']]);
  });

  it('answers 200 with the same build for a repeated idempotency key and stores nothing twice', async () => {
    const files = await buildFiles('zero-key');
    const meta = { branch: 'feature/retry', idempotencyKey: 'ci-job-77120' };
    const first = await submit(files, meta);
    expect(first.status).toBe(201);
    const before = await countBuildRows(server.database);
    const again = await submit(files, meta);
    expect(again.status).toBe(200);
    expect(again.body.build).toEqual(first.body.build);
    expect(await countBuildRows(server.database)).toEqual(before);
  });

  it('stores one build when uploads with one idempotency key race each other', async () => {
    const files = await buildFiles('backwards-time');
    const meta = { branch: 'feature/race', idempotencyKey: 'ci-job-77121' };
    const answers = await Promise.all([1, 2, 3, 4].map(() => submit(files, meta)));
    expect(answers.map((answer) => answer.status).sort()).toEqual([200, 200, 200, 201]);
    expect(new Set(answers.map((answer) => answer.body.build.id)).size).toBe(1);
    expect(await Build.count({ where: { projectId, idempotencyKey: 'ci-job-77121' } })).toBe(1);
    expect(await Asset.count({ where: { buildId: answers[0].body.build.id } })).toBe(2);
  });

  it.each([
    { order: 'after', jointName: 'Lantern' },
    { order: 'before', jointName: 'Anchor' }
  ])('lints a .gltf with its .bin when the .bin arrives $order it', async ({ order, jointName }) => {
    // Assets are linted while the upload still arrives; a .gltf linted before its .bin is in must
    // be linted again once it is, not reported as missing its buffer.
    const prop = await diverGltf({ jointName, binName: 'prop.bin' });
    const gltf = { path: 'props/prop.gltf', bytes: prop.gltf };
    const bin = { path: 'props/prop.bin', bytes: prop.bin };
    const { status, body } = await submit(order === 'after' ? [gltf, bin] : [bin, gltf], {
      branch: `feature/bin-${order}`
    });
    expect(status).toBe(201);
    expect(body.build).toMatchObject({ verdict: 'pass', assetCount: 1, counts: zeroCounts });
    const [asset] = await Asset.findAll({ where: { buildId: body.build.id } });
    expect(asset.unreadable).toBe(false);
    const [sideFiles] = await server.database.sequelize.query(
      'SELECT "path", "contentHash" FROM "asset_side_files" WHERE "assetId" = ?',
      { replacements: [asset.id] }
    );
    expect(sideFiles).toEqual([
      { path: 'prop.bin', contentHash: crypto.createHash('sha256').update(prop.bin).digest('hex') }
    ]);
  });

  it('gives a .gltf whose buffer was not sent one unreadable-asset error', async () => {
    const buoy = await diverGltf({ binName: 'buoy.bin' });
    const { body } = await submit([{ path: 'props/buoy.gltf', bytes: buoy.gltf }], { branch: 'feature/missing-bin' });
    expect(body.build.verdict).toBe('fail');
    const [finding] = await FindingRecord.findAll({ where: { buildId: body.build.id } });
    expect(finding.rule).toBe('asset-unreadable');
    expect(JSON.parse(finding.valuesJson!)).toEqual({ code: 'asset.side-file-missing' });
  });

  it('never opens a file outside the asset folder, even one that was uploaded', async () => {
    const buoy = await diverGltf({ binName: 'buoy.bin' });
    const json = JSON.parse(new TextDecoder().decode(buoy.gltf));
    json.buffers[0].uri = '../buoy.bin';
    const { body } = await submit(
      [
        { path: 'props/buoy.gltf', bytes: JSON.stringify(json) },
        { path: 'buoy.bin', bytes: buoy.bin }
      ],
      { branch: 'feature/climbing-uri' }
    );
    const [finding] = await FindingRecord.findAll({ where: { buildId: body.build.id } });
    expect(finding.rule).toBe('asset-unreadable');
    expect(JSON.parse(finding.valuesJson!)).toEqual({ code: 'asset.uri-outside-folder' });
  });

  it('gives the same findings to a moved asset, with its new path in place of the old one', async () => {
    const moved = await submit(
      [{ path: 'chars/divers/kelp-diver-v2.glb', bytes: await diverGlb({ defect: 'zero-key' }) }],
      {
        branch: 'feature/moved'
      }
    );
    const [finding] = await FindingRecord.findAll({ where: { buildId: moved.body.build.id } });
    const [original] = await FindingRecord.findAll({ where: { buildId: featureFailId } });
    expect(finding.assetPath).toBe('chars/divers/kelp-diver-v2.glb');
    expect(finding.message).toBe(original.message);
    expect(finding.fingerprint).not.toBe(original.fingerprint);
  });
});

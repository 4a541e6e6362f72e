/**
 * Reuse of stored lints against a real (temporary) database: the same bytes, side files, policy
 * and engine give the stored findings back; a moved asset gets the fingerprints a fresh lint at
 * its new path computes (the lint library is the oracle); anything that differs means a new lint.
 */
import crypto from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { lintAsset } from '$lib/lint/lint-asset';
import { defaultPolicy, policyVersionOf } from '$lib/lint/policy';
import { ENGINE_VERSION } from '$lib/lint/version';
import type { AssetReport } from '$lib/lint/lint-report';
import { findingColumnsOf } from '$lib/server/builds/finding-columns';
import { Asset, FindingRecord, Project } from '$lib/server/db/models';
import { assetSideFiles } from '$lib/server/ingest/asset-side-file';
import { findReusableLint } from '$lib/server/ingest/find-reusable-lint';
import { diverGlb, diverGltf } from './api-fixtures';
import { createStoredBuild } from './helpers/stored-build';
import { openTempDatabase, type TempDatabase } from './temp-database';

let temp: TempDatabase;
let projectId: number;
const policy = defaultPolicy();
const policyVersion = policyVersionOf(policy);
const sha256 = (bytes: Uint8Array) => crypto.createHash('sha256').update(bytes).digest('hex');

beforeAll(async () => {
  temp = await openTempDatabase();
  projectId = (await Project.create({ slug: 'tidewatch', name: 'Tidewatch' })).id;
});
afterAll(async () => temp?.remove());

/** Stores a linted asset the way ingestion does, in a build of the given engine version. */
async function store(
  report: AssetReport,
  contentHash: string,
  sideFiles: Record<string, string | null>,
  engineVersion = ENGINE_VERSION
): Promise<number> {
  const build = await createStoredBuild(projectId, { policyVersion, engineVersion });
  const asset = await Asset.create({
    buildId: build.id,
    path: report.path,
    contentHash,
    byteLength: report.byteLength,
    policyVersion,
    unreadable: report.unreadable,
    statsJson: JSON.stringify(report.stats),
    worstRule: null
  });
  for (const [path, hash] of Object.entries(sideFiles)) {
    await assetSideFiles().create({ assetId: asset.id, path, contentHash: hash });
  }
  await FindingRecord.bulkCreate(
    report.findings.map((finding) => ({
      ...findingColumnsOf(finding),
      buildId: build.id,
      assetId: asset.id,
      status: 'new' as const,
      waived: false,
      waiverId: null
    }))
  );
  return asset.id;
}

const noFiles = () => undefined;

describe('findReusableLint', () => {
  let glb: Uint8Array;
  let fresh: AssetReport;
  let storedId: number;

  beforeAll(async () => {
    glb = await diverGlb({ defect: 'zero-key' });
    fresh = await lintAsset({ path: 'chars/kelp-diver.glb', bytes: glb, readSideFile: async () => null }, policy);
    expect(fresh.findings.map((finding) => finding.rule)).toEqual(['not-a-rotation']);
    storedId = await store(fresh, sha256(glb), {});
  });

  it('gives back the stored findings for the same bytes at the same path', async () => {
    const reused = await findReusableLint(
      { path: 'chars/kelp-diver.glb', sha256: sha256(glb) },
      policyVersion,
      noFiles
    );
    expect(reused?.sourceAssetId).toBe(storedId);
    expect(reused?.report).toEqual(fresh);
  });

  it('re-stamps a moved asset with the fingerprints a fresh lint at the new path gives', async () => {
    const movedPath = 'chars/divers/kelp-diver-v2.glb';
    const oracle = await lintAsset({ path: movedPath, bytes: glb, readSideFile: async () => null }, policy);
    const reused = await findReusableLint({ path: movedPath, sha256: sha256(glb) }, policyVersion, noFiles);
    expect(reused?.report.findings).toEqual(oracle.findings);
  });

  it('re-stamps an unreadable asset, whose message starts with its path', async () => {
    const broken = new TextEncoder().encode('{"asset":{"version":"1.0"}}');
    const report = await lintAsset({ path: 'old/broken.gltf', bytes: broken, readSideFile: async () => null }, policy);
    expect(report.unreadable).toBe(true);
    await store(report, sha256(broken), {});
    const oracle = await lintAsset({ path: 'new/broken.gltf', bytes: broken, readSideFile: async () => null }, policy);
    const reused = await findReusableLint({ path: 'new/broken.gltf', sha256: sha256(broken) }, policyVersion, noFiles);
    expect(reused?.report.findings).toEqual(oracle.findings);
  });

  it('lints again under another policy version or engine version', async () => {
    expect(
      await findReusableLint({ path: 'chars/kelp-diver.glb', sha256: sha256(glb) }, 'ffffffffffffffff', noFiles)
    ).toBeNull();
    const other = await diverGlb({ defect: 'backwards-time' });
    const report = await lintAsset({ path: 'x.glb', bytes: other, readSideFile: async () => null }, policy);
    await store(report, sha256(other), {}, '0.9.0');
    expect(await findReusableLint({ path: 'x.glb', sha256: sha256(other) }, policyVersion, noFiles)).toBeNull();
  });

  describe('a .gltf with a side file', () => {
    let gltf: { gltf: Uint8Array; bin: Uint8Array };
    const path = 'props/buoy.gltf';

    beforeAll(async () => {
      gltf = await diverGltf({ binName: 'buoy.bin' });
      const report = await lintAsset({ path, bytes: gltf.gltf, readSideFile: async () => gltf.bin }, policy);
      await store(report, sha256(gltf.gltf), { 'buoy.bin': sha256(gltf.bin) });
    });

    it('is reused when the side file has the same content, wherever the pair moved', async () => {
      const digests: Record<string, string> = {
        'props/buoy.bin': sha256(gltf.bin),
        'moved/buoy.bin': sha256(gltf.bin)
      };
      const lookup = (uploadPath: string) => digests[uploadPath];
      expect((await findReusableLint({ path, sha256: sha256(gltf.gltf) }, policyVersion, lookup))?.sideFiles).toEqual({
        'buoy.bin': sha256(gltf.bin)
      });
      expect(
        await findReusableLint({ path: 'moved/buoy.gltf', sha256: sha256(gltf.gltf) }, policyVersion, lookup)
      ).not.toBeNull();
    });

    it('is linted again when the side file changed or is missing', async () => {
      const changed = (uploadPath: string) =>
        uploadPath === 'props/buoy.bin' ? sha256(new Uint8Array([1, 2, 3])) : undefined;
      expect(await findReusableLint({ path, sha256: sha256(gltf.gltf) }, policyVersion, changed)).toBeNull();
      expect(await findReusableLint({ path, sha256: sha256(gltf.gltf) }, policyVersion, noFiles)).toBeNull();
    });
  });
});

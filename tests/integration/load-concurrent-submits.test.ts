/**
 * Load on one server over SQLite: 20 `orientry submit` processes (the bundled CLI) start at once,
 * each sending a build of 10 assets (8 GLBs, 2 .gltf with their .bin) on its own branch. Odd
 * builds carry one asset whose key 2 is [0, 0, 0, 0] (not-a-rotation, an error by default), so
 * their gate fails; even builds are clean.
 *
 * Every CLI must exit with its verdict (0 or 1, never 2 or 3) on its first attempt, no busy- or
 * locked-database error may reach a client or the server log, and all 20 builds are stored whole:
 * 10 assets each, the side files of each .gltf, the right verdict and the error finding exactly
 * where it was built in.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Asset, Build, FindingRecord } from '$lib/server/db/models';
import { assetSideFiles } from '$lib/server/ingest/asset-side-file';
import { buildCli, runCliAsync, type CliRun } from '../../cli/testing/run-cli';
import { diverGlb, diverGltf } from './api-fixtures';
import { seedProject, startApiTestServer, type ApiTestServer } from './api-test-server';

const BUILD_COUNT = 20;
const ASSETS_PER_BUILD = 10;
const BROKEN_ASSET_INDEX = 6;
/** Generous for 20 builds on 2 cores; measured about 15 s here. */
const WALL_LIMIT_MS = 90_000;

let server: ApiTestServer;
let secret: string;
let work: string;
let runs: CliRun[] = [];
let wallMs = 0;

const isFailing = (buildIndex: number) => buildIndex % 2 === 1;
const branchOf = (buildIndex: number) => `load/crew-${buildIndex}`;

beforeAll(async () => {
  buildCli();
  server = await startApiTestServer();
  ({ secret } = await seedProject('reef-load'));
  work = fs.mkdtempSync(path.join(os.tmpdir(), 'orientry-load-'));
  for (let buildIndex = 0; buildIndex < BUILD_COUNT; buildIndex++) {
    const folder = path.join(work, `build-${buildIndex}`);
    for (let assetIndex = 0; assetIndex < ASSETS_PER_BUILD; assetIndex++) {
      // Distinct joint names make every file's bytes unique, so every asset is really linted.
      const jointName = `Hips_${buildIndex}_${assetIndex}`;
      const defect = isFailing(buildIndex) && assetIndex === BROKEN_ASSET_INDEX ? 'zero-key' : 'none';
      if (assetIndex < 8) {
        fs.mkdirSync(path.join(folder, 'chars'), { recursive: true });
        fs.writeFileSync(path.join(folder, 'chars', `diver-${assetIndex}.glb`), await diverGlb({ defect, jointName }));
      } else {
        const binName = `diver-${assetIndex}.bin`;
        const { gltf, bin } = await diverGltf({ defect, jointName, binName });
        fs.mkdirSync(path.join(folder, 'rigs'), { recursive: true });
        fs.writeFileSync(path.join(folder, 'rigs', `diver-${assetIndex}.gltf`), gltf);
        fs.writeFileSync(path.join(folder, 'rigs', binName), bin);
      }
    }
  }

  const startedAt = Date.now();
  runs = await Promise.all(
    Array.from({ length: BUILD_COUNT }, (_, buildIndex) =>
      runCliAsync(
        [
          'submit',
          `build-${buildIndex}`,
          '--root',
          `build-${buildIndex}`,
          '--server',
          server.url,
          '--project',
          'reef-load',
          '--branch',
          branchOf(buildIndex),
          '--commit',
          (0xabc0000 + buildIndex).toString(16),
          '--label',
          `#${buildIndex}`
        ],
        work,
        { env: { ORIENTRY_TOKEN: secret }, timeoutMs: WALL_LIMIT_MS }
      )
    )
  );
  wallMs = Date.now() - startedAt;
}, 300_000);

afterAll(async () => {
  await server?.remove();
  if (work) fs.rmSync(work, { recursive: true, force: true });
});

describe(`${BUILD_COUNT} CLI submissions of ${ASSETS_PER_BUILD} assets at once`, () => {
  it('all exit with their verdict (0 clean, 1 failing), on the first attempt, in reasonable time', () => {
    const outcomes = runs.map((run, buildIndex) => ({
      buildIndex,
      status: run.status,
      retried: /attempt \d+ of \d+ failed/.test(run.stderr)
    }));
    const expected = runs.map((_, buildIndex) => ({
      buildIndex,
      status: isFailing(buildIndex) ? 1 : 0,
      retried: false
    }));
    expect(outcomes, runs.map((run) => run.stderr).join('\n')).toEqual(expected);
    console.info(`load: ${BUILD_COUNT} × ${ASSETS_PER_BUILD} assets through the CLI in ${wallMs} ms`);
    expect(wallMs).toBeLessThan(WALL_LIMIT_MS);
  });

  it('lets no busy or locked database error reach a client or the server log', () => {
    const busy = /SQLITE_BUSY|SQLITE_LOCKED|database is locked|database table is locked/i;
    for (const run of runs) expect(run.stdout + run.stderr).not.toMatch(busy);
    expect(server.output.filter((line) => busy.test(line) || /Orientry error/.test(line))).toEqual([]);
  });

  it('stores all 20 builds whole, with the right verdicts, assets, side files and findings', async () => {
    const builds = await Build.findAll({ where: { branch: runs.map((_, index) => branchOf(index)) } });
    expect(builds).toHaveLength(BUILD_COUNT);
    for (let buildIndex = 0; buildIndex < BUILD_COUNT; buildIndex++) {
      const build = builds.find((candidate) => candidate.branch === branchOf(buildIndex))!;
      expect(build.verdict, branchOf(buildIndex)).toBe(isFailing(buildIndex) ? 'fail' : 'pass');
      expect(build.assetCount).toBe(ASSETS_PER_BUILD);
      expect(build.errorCount).toBe(isFailing(buildIndex) ? 1 : 0);
      const assets = await Asset.findAll({ where: { buildId: build.id } });
      expect(assets.map((asset) => asset.path).sort()).toEqual(
        [
          ...Array.from({ length: 8 }, (_, index) => `chars/diver-${index}.glb`),
          'rigs/diver-8.gltf',
          'rigs/diver-9.gltf'
        ].sort()
      );
      const errors = await FindingRecord.findAll({ where: { buildId: build.id, severity: 'error' } });
      expect(errors.map((finding) => [finding.assetPath, finding.rule])).toEqual(
        isFailing(buildIndex) ? [[`chars/diver-${BROKEN_ASSET_INDEX}.glb`, 'not-a-rotation']] : []
      );
      const sideFiles = await assetSideFiles().findAll({
        where: { assetId: assets.map((asset) => asset.id) },
        order: [['path', 'ASC']]
      });
      expect(sideFiles.map((row) => row.path)).toEqual(['diver-8.bin', 'diver-9.bin']);
    }
  });
});

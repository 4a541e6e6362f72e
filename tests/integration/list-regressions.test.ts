/**
 * listRegressions, the trends page's time-to-fix and regressing-assets panel, against a migrated
 * database: an error counts as fixed by the first later build that checked its asset without it,
 * not by a build that left the asset out.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Asset, FindingRecord, Project, type Build } from '$lib/server/db/models';
import { listRegressions } from '$lib/server/regressions/list-regressions';
import { createStoredBuild } from './helpers/stored-build';
import { openTempDatabase, type TempDatabase } from './temp-database';

let temp: TempDatabase;
let project: Project;
const builds: Build[] = [];
const start = Date.UTC(2026, 10, 2, 9);
const HOUR_MS = 60 * 60 * 1000;

/** A build on main `hours` after the start that checked `paths`, with the lamp error at `lampError` standing (none when null). */
async function addBuild(hours: number, paths: string[], lampError: 'new' | 'unchanged' | null): Promise<Build> {
  const build = await createStoredBuild(project.id, {
    label: `#${builds.length + 1}`,
    createdAt: new Date(start + hours * HOUR_MS)
  });
  for (const path of paths) {
    const asset = await Asset.create({
      buildId: build.id,
      path,
      contentHash: `${builds.length}`.padStart(64, '0'),
      byteLength: 10,
      policyVersion: build.policyVersion,
      unreadable: false,
      statsJson: '{}',
      worstRule: null
    });
    if (path === 'props/lighthouse-lamp.glb' && lampError) {
      await FindingRecord.create({
        buildId: build.id,
        assetId: asset.id,
        assetPath: path,
        rule: 'not-a-rotation',
        severity: 'error',
        animation: 'Spin',
        channel: 0,
        node: '/Lamp',
        keyFirst: 4,
        keyLast: 4,
        timeSeconds: 0.13,
        valuesJson: null,
        message: 'Key 4 is a zero quaternion.',
        hint: 'Re-export the key.',
        fingerprint: 'fp-lamp-zero-key',
        status: lampError,
        waiverId: null
      });
    }
  }
  builds.push(build);
  return build;
}

beforeAll(async () => {
  temp = await openTempDatabase();
  project = await Project.create({ slug: 'harbour-props', name: 'Harbour Props', baseBranch: 'main' });
  const lamp = 'props/lighthouse-lamp.glb';
  const buoy = 'props/buoy.glb';
  await addBuild(0, [lamp, buoy], 'new');
  // The lamp is left out of this build: its error is not fixed by it.
  await addBuild(1, [buoy], null);
  await addBuild(2, [lamp, buoy], 'unchanged');
  await addBuild(5, [lamp, buoy], null);
});

afterAll(async () => {
  await temp?.remove();
});

describe('listRegressions', () => {
  it('counts the error fixed by the first build that checked the lamp without it', async () => {
    const view = await listRegressions(project, { branch: 'main', from: '2026-11-01' });
    expect(view.timeToFix.items).toEqual([
      {
        fingerprint: 'fp-lamp-zero-key',
        rule: 'not-a-rotation',
        assetPath: 'props/lighthouse-lamp.glb',
        introducedIn: { id: builds[0].id, label: '#1', createdAt: builds[0].createdAt.toISOString() },
        fixedIn: { id: builds[3].id, label: '#4', createdAt: builds[3].createdAt.toISOString() },
        timeToFixMs: 5 * HOUR_MS
      }
    ]);
    expect(view.timeToFix).toMatchObject({ medianMs: 5 * HOUR_MS, fixedCount: 1, openCount: 0 });
    expect(view.regressingAssets.map((row) => row.assetPath)).toEqual(['props/lighthouse-lamp.glb']);
  });
});

/**
 * `meta.builtAt` through the real server: when CI built a build. It becomes the build's
 * createdAt, picks the baseline (the latest base-branch build at that time) and decides which
 * waivers were still in force. A time in the future or one that is not ISO 8601 is refused.
 */
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { Build, FindingRecord, Waiver } from '$lib/server/db/models';
import { diverGlb } from './api-fixtures';
import {
  countBuildRows,
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

const HOUR_MS = 3600_000;
const DAY_MS = 24 * HOUR_MS;

beforeAll(async () => {
  server = await startApiTestServer();
  const seeded = await seedProject('tidewatch');
  secret = seeded.secret;
  projectId = seeded.project.id;
});
afterAll(async () => server?.remove());

async function files(defect: 'none' | 'zero-key'): Promise<UploadFile[]> {
  return [{ path: 'chars/kelp-diver.glb', bytes: await diverGlb({ defect }) }];
}

async function submit(defect: 'none' | 'zero-key', meta: Record<string, unknown>): Promise<BuildAnswer['build']> {
  const response = await postBuild(server, 'tidewatch', secret, await files(defect), meta);
  const text = await response.text();
  expect(response.status, text).toBe(201);
  return (JSON.parse(text) as BuildAnswer).build;
}

describe('meta.builtAt refusals', () => {
  let rowsBefore: Record<string, number>;
  beforeEach(async () => {
    rowsBefore = await countBuildRows(server.database);
  });

  async function expectRefused(builtAt: unknown, reason: string): Promise<void> {
    const response = await postBuild(server, 'tidewatch', secret, await files('none'), { branch: 'main', builtAt });
    expect(response.status).toBe(400);
    const { error } = (await response.json()) as { error: { code: string; message: string } };
    expect(error.code).toBe('upload.meta-invalid');
    expect(error.message).toContain(`meta.builtAt: ${reason}`);
    expect(await countBuildRows(server.database)).toEqual(rowsBefore);
  }

  it('refuses a time an hour in the future, naming the field', async () => {
    await expectRefused(new Date(Date.now() + HOUR_MS).toISOString(), 'must not be in the future');
  });

  it.each([
    { builtAt: 'yesterday', why: 'not a time at all' },
    { builtAt: '2026-05-01T12:00:00', why: 'no offset, so the instant is unknown' },
    { builtAt: '2026-13-01T12:00:00Z', why: 'month 13' },
    { builtAt: 1714564800000, why: 'a number, not ISO 8601 text' }
  ])('refuses $builtAt ($why)', async ({ builtAt }) => {
    await expectRefused(builtAt, 'must be an ISO 8601 time');
  });

  it('accepts a time a minute ahead, within the clock slack between CI and server', async () => {
    const builtAt = new Date(Date.now() + 60_000);
    const build = await submit('none', { branch: 'slack-check', builtAt: builtAt.toISOString() });
    expect(Date.parse(build.createdAt)).toBe(builtAt.getTime());
  });
});

describe('builds replayed with builtAt', () => {
  // Three main builds a day apart, a week ago, posted in order: clean, then a zero key twice.
  const start = Date.now() - 7 * DAY_MS;
  const times = [0, 1, 2].map((day) => new Date(start + day * DAY_MS));
  const ids: number[] = [];

  it('store each build at its builtAt and compare it with the main build before it', async () => {
    const defects = ['none', 'zero-key', 'zero-key'] as const;
    for (const [index, defect] of defects.entries()) {
      const build = await submit(defect, {
        branch: 'main',
        label: `#${index + 1}`,
        builtAt: times[index].toISOString()
      });
      ids.push(build.id);
      expect(build.createdAt).toBe(times[index].toISOString());
      expect((await Build.findByPk(build.id))?.createdAt.getTime()).toBe(times[index].getTime());
    }
    const stored = await Build.findAll({ where: { id: ids }, order: [['id', 'ASC']] });
    expect(stored.map((build) => [build.baselineBuildId, build.verdict, build.newCount, build.unchangedCount])).toEqual(
      [
        [null, 'pass', 0, 0],
        [ids[0], 'fail', 1, 0],
        [ids[1], 'pass', 0, 1]
      ]
    );
  });

  it('compares a build built before the latest main build with the main build before it', async () => {
    // Built between builds 1 and 2: its baseline is the clean build 1, so the zero key is new.
    const between = new Date(times[0].getTime() + 12 * HOUR_MS);
    const build = await submit('zero-key', { branch: 'feature/old-swim', builtAt: between.toISOString() });
    expect(build.baselineBuildId).toBe(ids[0]);
    expect(build).toMatchObject({ verdict: 'fail', counts: { new: 1, unchanged: 0 } });
    expect(build.createdAt).toBe(between.toISOString());
  });

  it('compares a late main build with the main build before its builtAt, not the latest one', async () => {
    const between = new Date(times[1].getTime() + 12 * HOUR_MS);
    const build = await submit('zero-key', { branch: 'main', label: '#2b', builtAt: between.toISOString() });
    expect(build.baselineBuildId).toBe(ids[1]);
    expect(build).toMatchObject({ verdict: 'pass', counts: { new: 0, unchanged: 1 } });
  });

  it('compares a build without builtAt with the latest main build by time', async () => {
    const build = await submit('zero-key', { branch: 'feature/now' });
    const latestMain = await Build.findOne({
      where: { projectId, branch: 'main' },
      order: [
        ['createdAt', 'DESC'],
        ['id', 'DESC']
      ]
    });
    expect(build.baselineBuildId).toBe(latestMain!.id);
    expect(Math.abs(Date.parse(build.createdAt) - Date.now())).toBeLessThan(60_000);
  });

  it('applies a waiver that was in force at builtAt, though it has expired since', async () => {
    const [finding] = await FindingRecord.findAll({ where: { buildId: ids[1], status: 'new' } });
    const waiver = await Waiver.create({
      projectId,
      scope: 'fingerprint',
      fingerprint: finding.fingerprint,
      rule: null,
      assetPath: null,
      reason: 'Placeholder key until the swim cycle is re-exported.',
      expiresAt: new Date(Date.now() - DAY_MS),
      status: 'approved',
      proposedById: null
    });
    try {
      const early = await submit('zero-key', {
        branch: 'feature/replayed',
        builtAt: new Date(Date.now() - 2 * DAY_MS).toISOString()
      });
      expect(early).toMatchObject({ verdict: 'pass', counts: { waived: 1, error: 0 } });
      const late = await submit('zero-key', { branch: 'feature/replayed-late' });
      expect(late.counts.waived).toBe(0);
    } finally {
      await waiver.destroy();
    }
  });
});

/**
 * prefetchBaseline, which reads a build's baseline findings while its files still stream in,
 * against a migrated database: the early read is used only when the baseline is still the same
 * build once the upload is complete (see src/lib/server/ingest/baseline-prefetch.ts).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Build, FindingRecord, Project } from '$lib/server/db/models';
import { prefetchBaseline } from '$lib/server/ingest/baseline-prefetch';
import { createStoredBuild } from './helpers/stored-build';
import { openTempDatabase, type TempDatabase } from './temp-database';

let temp: TempDatabase;
let project: Project;
const DAY_MS = 24 * 60 * 60 * 1000;

/** A base-branch build with one standing finding whose fingerprint names the build. */
async function addBaseBuild(label: string, createdAt: Date): Promise<Build> {
  const build = await createStoredBuild(project.id, { label, createdAt });
  await FindingRecord.create({
    buildId: build.id,
    assetId: null,
    assetPath: 'props/lamp.glb',
    rule: 'unit-drift',
    severity: 'warning',
    animation: 'Sway',
    channel: 0,
    node: '/Lamp',
    keyFirst: 3,
    keyLast: 3,
    timeSeconds: 0.1,
    valuesJson: null,
    message: 'Key 3 is 1.02 long.',
    hint: 'Renormalize.',
    fingerprint: `fp-${label}`,
    status: 'new',
    waiverId: null
  });
  return build;
}

const fingerprints = (findings: { fingerprint: string }[] | null) => findings?.map((finding) => finding.fingerprint);

beforeAll(async () => {
  temp = await openTempDatabase();
  project = await Project.create({ slug: 'lamp-room', name: 'Lamp Room', baseBranch: 'main' });
});

afterAll(async () => {
  await temp?.remove();
});

describe('prefetchBaseline', () => {
  it('gives no baseline for a project without base-branch builds', async () => {
    const baseline = await prefetchBaseline(project).baselineAt(new Date());
    expect(baseline).toEqual({ build: null, findings: null });
  });

  it('gives the early read when the baseline is unchanged at the end of the upload', async () => {
    const first = await addBaseBuild('#1', new Date(Date.now() - 2 * DAY_MS));
    const baseline = await prefetchBaseline(project).baselineAt(new Date());
    expect(baseline.build?.id).toBe(first.id);
    expect(fingerprints(baseline.findings)).toEqual(['fp-#1']);
  });

  it('reads the new baseline when a base-branch build lands during the upload', async () => {
    const prefetch = prefetchBaseline(project);
    // Stored after the prefetch started, so the early read (as of its start) cannot have seen it.
    const landed = await addBaseBuild('#2', new Date(Date.now() + 1000));
    const baseline = await prefetch.baselineAt(new Date(Date.now() + 2000));
    expect(baseline.build?.id).toBe(landed.id);
    expect(fingerprints(baseline.findings)).toEqual(['fp-#2']);
  });

  it('reads the baseline of the build time the upload names when it is in the past', async () => {
    const prefetch = prefetchBaseline(project);
    const baseline = await prefetch.baselineAt(new Date(Date.now() - DAY_MS));
    expect(baseline.build?.label).toBe('#1');
    expect(fingerprints(baseline.findings)).toEqual(['fp-#1']);
  });
});

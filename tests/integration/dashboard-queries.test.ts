/**
 * The dashboard's own queries against a migrated SQLite database: the builds table's paging,
 * filters and sorts, the branch list, the finding filters' choices and the policy a build used.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { defaultPolicy, parsePolicy, policyVersionOf } from '$lib/lint/policy';
import { Build, FindingRecord, Project, ProjectPolicy } from '$lib/server/db/models';
import { findBuildPolicy } from '$lib/server/dashboard/find-build-policy';
import {
  BUILD_TABLE_PAGE_SIZE,
  listBuildTable,
  parseBuildTableQuery,
  type BuildTableQuery
} from '$lib/server/dashboard/list-build-table';
import { listFindingFacets } from '$lib/server/dashboard/list-finding-facets';
import { listProjectBranches } from '$lib/server/dashboard/list-project-branches';
import { openTempDatabase, type TempDatabase } from './temp-database';

let temp: TempDatabase;
let project: Project;
const HOUR_MS = 60 * 60 * 1000;
const start = Date.UTC(2026, 10, 1);
const ORIGIN = 'https://orientry.lanternfish.example';

/** Build n (0-based): every third fails, new findings cycle 0..4, every fourth is on a feature branch. */
async function addBuild(n: number, createdAt = new Date(start + n * HOUR_MS)): Promise<Build> {
  return Build.create({
    projectId: project.id,
    branch: n % 4 === 3 ? 'feature/lamp-rework' : 'main',
    commitSha: `${n}`.padStart(40, 'a'),
    label: `#${1000 + n}`,
    ciJobUrl: null,
    idempotencyKey: null,
    verdict: n % 3 === 0 ? 'fail' : 'pass',
    verdictReason: null,
    baselineBuildId: null,
    policyVersion: policyVersionOf(defaultPolicy()),
    engineVersion: '1.0.0',
    newCount: n % 5,
    durationMs: 50,
    createdAt
  });
}

function query(overrides: Partial<BuildTableQuery> = {}): BuildTableQuery {
  return { sort: 'time', order: 'desc', page: 1, ...overrides };
}

const labels = (page: { builds: { label: string | null }[] }) => page.builds.map((build) => build.label);

beforeAll(async () => {
  temp = await openTempDatabase();
  project = await Project.create({ slug: 'tidewatch-props', name: 'Tidewatch Props', baseBranch: 'main' });
  for (let n = 0; n < 30; n++) await addBuild(n);
});

afterAll(async () => {
  await temp?.remove();
});

describe('listBuildTable', () => {
  it('pages newest first, 25 to a page', async () => {
    const first = await listBuildTable(project, query(), ORIGIN);
    expect(first).toMatchObject({ total: 30, totalPages: 2, pageSize: BUILD_TABLE_PAGE_SIZE });
    expect(labels(first).slice(0, 2)).toEqual(['#1029', '#1028']);
    const second = await listBuildTable(project, query({ page: 2 }), ORIGIN);
    expect(labels(second)).toEqual(['#1004', '#1003', '#1002', '#1001', '#1000']);
    expect(second.builds[0].reportUrl).toBe(`${ORIGIN}/projects/tidewatch-props/builds/${second.builds[0].id}`);
  });

  it('filters by branch and verdict together', async () => {
    const page = await listBuildTable(project, query({ branch: 'feature/lamp-rework', verdict: 'fail' }), ORIGIN);
    // Builds 3, 15 and 27 are both on the feature branch (n % 4 = 3) and failing (n % 3 = 0).
    expect(labels(page)).toEqual(['#1027', '#1015', '#1003']);
  });

  it('puts failed builds first when sorting by verdict, newest first within each verdict', async () => {
    const page = await listBuildTable(project, query({ sort: 'verdict', order: 'desc' }), ORIGIN);
    expect(labels(page).slice(0, 3)).toEqual(['#1027', '#1024', '#1021']);
    const ascending = await listBuildTable(project, query({ sort: 'verdict', order: 'asc' }), ORIGIN);
    expect(ascending.builds[0].verdict).toBe('pass');
    expect(labels(ascending)[0]).toBe('#1029');
  });

  it('sorts by new findings, newest first among equals', async () => {
    const page = await listBuildTable(project, query({ sort: 'new', order: 'desc' }), ORIGIN);
    // n % 5 = 4 for builds 29, 24, 19, 14, 9, 4.
    expect(labels(page).slice(0, 6)).toEqual(['#1029', '#1024', '#1019', '#1014', '#1009', '#1004']);
    expect(page.builds.map((build) => build.counts.new)).toEqual(
      [...page.builds.map((build) => build.counts.new)].sort((a, b) => b - a)
    );
  });

  it('reads its query leniently: unknown or broken values fall back to the defaults', () => {
    const parsed = parseBuildTableQuery(
      new URLSearchParams('verdict=maybe&sort=sideways&order=up&page=-3&branch=main')
    );
    expect(parsed).toEqual({ branch: 'main', verdict: undefined, sort: 'time', order: 'desc', page: 1 });
    expect(parseBuildTableQuery(new URLSearchParams('sort=new&order=asc&page=2&utm=x'))).toEqual({
      branch: undefined,
      verdict: undefined,
      sort: 'new',
      order: 'asc',
      page: 2
    });
  });
});

describe('listProjectBranches', () => {
  it('lists the base branch first, then the others by name, with their build counts', async () => {
    expect(await listProjectBranches(project)).toEqual([
      { name: 'main', buildCount: 23 },
      { name: 'feature/lamp-rework', buildCount: 7 }
    ]);
  });
});

describe('listFindingFacets', () => {
  it('offers the rules and assets that have findings in the build, with counts and rule titles', async () => {
    const build = await addBuild(99);
    const row = (rule: string, assetPath: string, status: 'new' | 'fixed') => ({
      buildId: build.id,
      assetId: null,
      assetPath,
      rule,
      severity: 'warning' as const,
      status,
      waiverId: null,
      animation: null,
      channel: null,
      node: null,
      keyFirst: null,
      keyLast: null,
      timeSeconds: null,
      valuesJson: null,
      message: 'm',
      hint: 'h',
      // Fingerprints are 32 characters at most (findings.fingerprint is VARCHAR(32)).
      fingerprint: `${rule}-${assetPath}-${status}`.slice(-32)
    });
    await FindingRecord.bulkCreate([
      row('unit-drift', 'props/lamp.glb', 'new'),
      row('unit-drift', 'props/buoy.glb', 'new'),
      row('hemisphere-jump', 'props/lamp.glb', 'fixed'),
      row('retired-rule', 'props/lamp.glb', 'new')
    ]);
    const facets = await listFindingFacets(build.id);
    expect(facets.rules.map(({ rule, count }) => [rule, count])).toEqual([
      ['hemisphere-jump', 1],
      ['retired-rule', 1],
      ['unit-drift', 2]
    ]);
    expect(facets.rules.find((facet) => facet.rule === 'unit-drift')?.title).not.toBe('unit-drift');
    expect(facets.rules.find((facet) => facet.rule === 'retired-rule')?.title).toBe('retired-rule');
    expect(facets.assets).toEqual([
      { path: 'props/buoy.glb', count: 1 },
      { path: 'props/lamp.glb', count: 3 }
    ]);
  });
});

describe('findBuildPolicy', () => {
  it('finds the saved revision a build was linted under, even after a newer one', async () => {
    const lamp = parsePolicy({ maxSpeedDegreesPerSecond: 2160 });
    const stricter = parsePolicy({ maxSpeedDegreesPerSecond: 720 });
    await ProjectPolicy.create({
      projectId: project.id,
      revision: 1,
      policyJson: JSON.stringify(lamp),
      policyVersion: policyVersionOf(lamp),
      createdById: null
    });
    await ProjectPolicy.create({
      projectId: project.id,
      revision: 2,
      policyJson: JSON.stringify(stricter),
      policyVersion: policyVersionOf(stricter),
      createdById: null
    });
    const build = await addBuild(100);
    await build.update({ policyVersion: policyVersionOf(lamp) });
    expect(await findBuildPolicy(build)).toMatchObject({ isExact: true, policy: { maxSpeedDegreesPerSecond: 2160 } });
  });

  it('recognises the default policy, and falls back to the current one for an unknown version', async () => {
    const onDefault = await addBuild(101);
    expect(await findBuildPolicy(onDefault)).toMatchObject({ isExact: true, policy: defaultPolicy() });
    await onDefault.update({ policyVersion: '0000000000000000' });
    expect(await findBuildPolicy(onDefault)).toMatchObject({
      isExact: false,
      policy: { maxSpeedDegreesPerSecond: 720 }
    });
  });
});

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Build, Project, ProjectMembership, User } from '$lib/server/db/models';
import { toSessionUser } from '$lib/server/auth/session-user';
import { listProjectOverviews, TREND_LENGTH } from '$lib/server/projects/project-overview';
import type { SessionUser } from '$lib/types/session-user';
import { openTempDatabase, type TempDatabase } from './temp-database';

let temp: TempDatabase;
let member: SessionUser;
let busy: Project;

const DAY_MS = 24 * 60 * 60 * 1000;
const start = Date.UTC(2026, 2, 1);

async function addBuild(
  project: Project,
  day: number,
  branch: string,
  errors: number,
  verdict: 'pass' | 'fail' = 'pass'
) {
  return Build.create({
    projectId: project.id,
    branch,
    commitSha: `c${day}`.padEnd(40, '0'),
    label: `build ${day}`,
    ciJobUrl: null,
    idempotencyKey: null,
    verdict,
    verdictReason: null,
    baselineBuildId: null,
    policyVersion: 'p',
    engineVersion: '1.0.0',
    errorCount: errors,
    warningCount: errors * 2,
    infoCount: 1,
    durationMs: 100,
    createdAt: new Date(start + day * DAY_MS)
  });
}

beforeAll(async () => {
  temp = await openTempDatabase();
  member = toSessionUser(
    await User.create({ email: 'member@lanternfish.example', name: 'Member', passwordHash: 'x', role: 'artist' })
  );
  busy = await Project.create({ slug: 'busy-project', name: 'Busy Project', baseBranch: 'main' });
  const quiet = await Project.create({ slug: 'quiet-project', name: 'Quiet Project', baseBranch: 'trunk' });
  await Project.create({ slug: 'secret-project', name: 'Secret Project' });
  await ProjectMembership.bulkCreate([
    { projectId: busy.id, userId: member.id, role: 'artist' },
    { projectId: quiet.id, userId: member.id, role: 'viewer' }
  ]);
  // 25 base-branch builds on days 0..24 with errors = day, then a failing feature-branch build on day 30.
  for (let day = 0; day < 25; day++) await addBuild(busy, day, 'main', day);
  await addBuild(busy, 30, 'feature/rope-swing', 99, 'fail');
});
afterAll(async () => {
  await temp.remove();
});

describe('the home page overview', () => {
  it('lists only the projects the user belongs to, by name', async () => {
    const overviews = await listProjectOverviews(member);
    expect(overviews.map((overview) => overview.slug)).toEqual(['busy-project', 'quiet-project']);
  });

  it('shows the latest build of any branch, and when it arrived', async () => {
    const [overview] = await listProjectOverviews(member);
    expect(overview.latest).toMatchObject({ verdict: 'fail', branch: 'feature/rope-swing', label: 'build 30' });
    expect(overview.lastBuildAt).toBe(new Date(start + 30 * DAY_MS).toISOString());
  });

  it('trends the last 20 base-branch builds, oldest first, and counts open findings of the newest', async () => {
    const [overview] = await listProjectOverviews(member);
    expect(overview.trend).toHaveLength(TREND_LENGTH);
    expect(overview.trend.map((point) => point.error)).toEqual(Array.from({ length: 20 }, (_, index) => index + 5));
    expect(overview.trend[0].createdAt).toBe(new Date(start + 5 * DAY_MS).toISOString());
    expect(overview.open).toEqual({ error: 24, warning: 48, info: 1 });
  });

  it('gives a project without builds empty values', async () => {
    const quiet = (await listProjectOverviews(member))[1];
    expect(quiet).toEqual({
      slug: 'quiet-project',
      name: 'Quiet Project',
      baseBranch: 'trunk',
      latest: null,
      open: { error: 0, warning: 0, info: 0 },
      trend: [],
      lastBuildAt: null
    });
  });
});

/**
 * The build-mail hook's decisions, run inside a transaction as ingestion runs it: which builds
 * mail, whom, and what the project's notify setting changes. Builds and plans are made directly,
 * so each case states exactly the findings it is about.
 */
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import type { Finding, Severity } from '$lib/lint/finding';
import { hashPassword } from '$lib/server/auth/password';
import { resetConfig } from '$lib/server/config';
import { Asset, Build, MailMessage, Project, ProjectMembership, User } from '$lib/server/db/models';
import type { BaselineStatus } from '$lib/server/ingest/compare-with-baseline';
import type { BuildPlan } from '$lib/server/ingest/plan-build';
import { queueBuildMail } from '$lib/server/mail/build-mail-hook';
import { saveMailSettings } from '$lib/server/mail/mail-settings';
import {
  getProjectNotify,
  PROJECT_NOTIFY_DEFAULTS,
  projectNotifySchema,
  setProjectNotify
} from '$lib/server/mail/project-notify';
import { openDatabaseUnderTest, type DatabaseUnderTest } from './helpers/database-under-test';

let temp: DatabaseUnderTest;
let project: Project;
let lead: User;
let artist: User;

beforeAll(async () => {
  process.env.AUTH_SECRET = 'hook-test-secret-that-is-at-least-32-characters';
  resetConfig();
  temp = await openDatabaseUnderTest();
  const passwordHash = await hashPassword('not-used-here');
  lead = await User.create({ email: 'tomasz@lanternfish.example', name: 'Tomasz', role: 'lead', passwordHash });
  artist = await User.create({ email: 'juno@lanternfish.example', name: 'Juno', role: 'artist', passwordHash });
  project = await Project.create({ slug: 'tidewatch-characters', name: 'Tidewatch Characters', baseBranch: 'main' });
  await ProjectMembership.create({ projectId: project.id, userId: lead.id, role: 'lead' });
  await ProjectMembership.create({ projectId: project.id, userId: artist.id, role: 'artist' });
});
afterAll(async () => {
  await temp.remove();
  delete process.env.AUTH_SECRET;
  resetConfig();
});
beforeEach(async () => {
  await MailMessage.destroy({ where: {} });
  await setProjectNotify(project.id, PROJECT_NOTIFY_DEFAULTS);
  await User.update({ disabledAt: null, mailPreference: 'all' }, { where: {} });
});

interface PlannedRow {
  severity: Severity;
  status: BaselineStatus;
  isWaived?: boolean;
}

/** Stores a build with one asset and runs the hook on a plan holding `rows`, in one transaction. */
async function storeBuild(
  rows: PlannedRow[],
  options: { branch?: string; verdict?: 'pass' | 'fail'; rollBack?: boolean } = {}
): Promise<Build> {
  const verdict = options.verdict ?? 'pass';
  const branch = options.branch ?? 'main';
  let stored: Build | undefined;
  const work = temp.database.sequelize.transaction(async (transaction) => {
    const build = await Build.create(
      {
        projectId: project.id,
        branch,
        commitSha: null,
        label: null,
        ciJobUrl: null,
        idempotencyKey: null,
        baselineBuildId: null,
        policyVersion: 'p1',
        engineVersion: 'e1',
        durationMs: 1,
        verdict,
        verdictReason: null
      },
      { transaction }
    );
    await Asset.create(
      {
        buildId: build.id,
        path: 'chars/kelp-diver.glb',
        contentHash: 'a'.repeat(64),
        byteLength: 10,
        policyVersion: 'p1',
        statsJson: null,
        worstRule: null
      },
      { transaction }
    );
    const findings = rows.map((row, index) => ({
      finding: findingOf(row.severity, index),
      status: row.status,
      waiverId: row.isWaived ? 1 : null
    }));
    const plan = {
      assets: [
        {
          report: { path: 'chars/kelp-diver.glb' },
          findings,
          counts: { error: 0, warning: 0, info: 0 },
          worstRule: null
        }
      ],
      counts: { error: 0, warning: 0, info: 0, new: 0, unchanged: 0, fixed: 0, waived: 0 },
      decision: { verdict, reason: '', failing: [] }
    } as unknown as BuildPlan;
    await queueBuildMail({
      project,
      build,
      plan,
      transaction,
      reportUrl: `https://orientry.example/projects/${project.slug}/builds/${build.id}`
    });
    stored = build;
    if (options.rollBack) throw new Error('roll back');
  });
  if (options.rollBack) await expect(work).rejects.toThrow('roll back');
  else await work;
  return stored!;
}

function findingOf(severity: Severity, index: number): Finding {
  return {
    rule: 'hemisphere-jump',
    severity,
    asset: 'chars/kelp-diver.glb',
    animation: 'Swim',
    channel: 0,
    node: '/Diver/Hips',
    keys: [index, index + 1],
    time: index * 0.5,
    values: {},
    message: `finding ${index}`,
    hint: '',
    fingerprint: index.toString(16).padStart(16, '0')
  };
}

const mailKinds = async () =>
  (await MailMessage.findAll({ order: [['toAddress', 'ASC']] })).map(
    (message) => `${message.kind} ${message.toAddress}`
  );

describe('build-mail hook', () => {
  it('mails a failed build to the lead only, when nobody subscribed', async () => {
    await storeBuild([{ severity: 'error', status: 'new' }], { verdict: 'fail', branch: 'feature/x' });
    expect(await mailKinds()).toEqual([`build-regression ${lead.email}`]);
  });

  it('mails subscribed members too', async () => {
    await saveMailSettings(artist.id, { preference: 'all', projectIds: [project.id] });
    try {
      await storeBuild([{ severity: 'error', status: 'new' }], { verdict: 'fail' });
      expect(await mailKinds()).toEqual([`build-regression ${artist.email}`, `build-regression ${lead.email}`]);
    } finally {
      await saveMailSettings(artist.id, { preference: 'all', projectIds: [] });
    }
  });

  it('queues nothing when the build rolls back', async () => {
    await storeBuild([{ severity: 'error', status: 'new' }], { verdict: 'fail', rollBack: true });
    expect(await MailMessage.count()).toBe(0);
  });

  it('stays quiet about a new warning under the default notify severity (error)', async () => {
    await storeBuild([{ severity: 'warning', status: 'new' }]);
    expect(await MailMessage.count()).toBe(0);
  });

  it('mails a new warning once the project notifies from warnings', async () => {
    await setProjectNotify(project.id, { severity: 'warning', onFixed: true });
    const build = await storeBuild([
      { severity: 'warning', status: 'new' },
      { severity: 'info', status: 'new' }
    ]);
    const [message] = await MailMessage.findAll();
    expect(message.subject).toBe(`[Tidewatch Characters] main · build #${build.id}: 1 new finding`);
  });

  it('ignores waived and unchanged findings', async () => {
    await storeBuild([
      { severity: 'error', status: 'new', isWaived: true },
      { severity: 'error', status: 'unchanged' }
    ]);
    expect(await MailMessage.count()).toBe(0);
  });

  it('announces a fix on the base branch, unless the project turned that off', async () => {
    await storeBuild([{ severity: 'error', status: 'fixed' }]);
    expect(await mailKinds()).toEqual([`build-fixed ${lead.email}`]);
    await MailMessage.destroy({ where: {} });
    await setProjectNotify(project.id, { severity: 'error', onFixed: false });
    await storeBuild([{ severity: 'error', status: 'fixed' }]);
    expect(await MailMessage.count()).toBe(0);
  });

  it('does not announce fixes on other branches', async () => {
    await storeBuild([{ severity: 'error', status: 'fixed' }], { branch: 'feature/x' });
    expect(await MailMessage.count()).toBe(0);
  });

  it('skips disabled accounts and people who chose no mail or the base branch only', async () => {
    await User.update({ disabledAt: new Date() }, { where: { id: lead.id } });
    await storeBuild([{ severity: 'error', status: 'new' }], { verdict: 'fail' });
    await User.update({ disabledAt: null, mailPreference: 'none' }, { where: { id: lead.id } });
    await storeBuild([{ severity: 'error', status: 'new' }], { verdict: 'fail' });
    await User.update({ mailPreference: 'base' }, { where: { id: lead.id } });
    await storeBuild([{ severity: 'error', status: 'new' }], { verdict: 'fail', branch: 'feature/x' });
    expect(await MailMessage.count()).toBe(0);
    await storeBuild([{ severity: 'error', status: 'new' }], { verdict: 'fail', branch: 'main' });
    expect(await mailKinds()).toEqual([`build-regression ${lead.email}`]);
  });
});

describe('project notify setting', () => {
  it('starts at errors with fixes announced', async () => {
    const fresh = await Project.create({ slug: 'tidewatch-props', name: 'Tidewatch Props' });
    expect(await getProjectNotify(fresh.id)).toEqual({ severity: 'error', onFixed: true });
  });

  it.each([
    { input: { severity: 'warning', onFixed: 'on' }, expected: { severity: 'warning', onFixed: true } },
    { input: { severity: 'info' }, expected: { severity: 'info', onFixed: false } },
    { input: { severity: 'error', onFixed: false }, expected: { severity: 'error', onFixed: false } }
  ])('reads the settings form $input', ({ input, expected }) => {
    expect(projectNotifySchema.parse(input)).toEqual(expected);
  });

  it('refuses an unknown severity', () => {
    expect(projectNotifySchema.safeParse({ severity: 'off', onFixed: true }).success).toBe(false);
  });
});

import crypto from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes, UniqueConstraintError, ValidationError } from 'sequelize';
import {
  ApiToken,
  Asset,
  Build,
  FindingRecord,
  Project,
  ProjectMembership,
  ProjectPolicy,
  User,
  Waiver,
  WaiverEvent
} from '$lib/server/db/models';
import * as apiTokens from '$lib/server/tokens/api-tokens';
import { createStoredBuild } from './helpers/stored-build';
import { openTempDatabase, type TempDatabase } from './temp-database';

let temp: TempDatabase;

/** How SQLite and PostgreSQL word a refused CHECK and a broken foreign key. */
const CHECK_FAILED = /CHECK constraint failed|violates check constraint/;
const FOREIGN_KEY_FAILED = /FOREIGN KEY constraint failed|violates foreign key constraint/;
const CHECK_OR_LENGTH_FAILED = new RegExp(`${CHECK_FAILED.source}|value too long`);
let counter = 0;

beforeAll(async () => {
  temp = await openTempDatabase();
});
afterAll(async () => {
  await temp.remove();
});

function unique(prefix: string): string {
  counter += 1;
  return `${prefix}-${counter}`;
}

async function makeUser(overrides: Partial<{ email: string; role: string }> = {}): Promise<User> {
  return User.create({
    email: overrides.email ?? `${unique('user')}@lanternfish.example`,
    name: 'Test Person',
    passwordHash: 'not-a-real-hash',
    role: (overrides.role ?? 'artist') as User['role']
  });
}

async function makeProject(slug = unique('project')): Promise<Project> {
  return Project.create({ slug, name: `Project ${slug}` });
}

/** Inserts a row with raw SQL, bypassing model validation, to test the database's own constraints. */
async function insertRaw(table: string, row: Record<string, unknown>): Promise<void> {
  const now = new Date().toISOString();
  const values = { createdAt: now, updatedAt: now, ...row };
  const columns = Object.keys(values);
  await temp.database.sequelize.query(
    `INSERT INTO ${table} (${columns.map((c) => `"${c}"`).join(', ')}) VALUES (${columns.map(() => '?').join(', ')})`,
    { replacements: Object.values(values) }
  );
}

/** Expects the database itself (not model validation) to refuse a statement with a message matching `pattern`. */
async function expectRefusedByDatabase(statement: Promise<unknown>, pattern: RegExp): Promise<void> {
  const error = await statement.then(
    () => null,
    (caught: { original?: Error; message: string }) => caught
  );
  expect(error, 'the statement should have failed').not.toBeNull();
  // Sequelize wraps the driver's constraint errors; the driver's own message is on `original`.
  expect(error!.original?.message ?? error!.message).toMatch(pattern);
}

async function makeBuild(project: Project, branch = 'main'): Promise<Build> {
  return createStoredBuild(project.id, { branch, policyVersion: '0123456789abcdef', engineVersion: '1.0.0' });
}

describe('users', () => {
  it('stores e-mail addresses trimmed and lower-cased', async () => {
    const user = await makeUser({ email: '  Mixed.Case@Lanternfish.Example ' });
    expect(user.email).toBe('mixed.case@lanternfish.example');
  });

  it('refuses a second user with the same e-mail in another case', async () => {
    await makeUser({ email: 'twice@lanternfish.example' });
    await expect(makeUser({ email: 'TWICE@lanternfish.example' })).rejects.toBeInstanceOf(UniqueConstraintError);
  });

  it('refuses an unknown role in the model and in the database', async () => {
    await expect(makeUser({ role: 'owner' })).rejects.toBeInstanceOf(ValidationError);
    await expectRefusedByDatabase(
      insertRaw('users', {
        email: `${unique('raw')}@lanternfish.example`,
        name: 'Raw',
        passwordHash: 'x',
        role: 'owner'
      }),
      CHECK_FAILED
    );
  });

  it('defaults new users to the viewer role and all mail', async () => {
    const user = await User.create({
      email: `${unique('default')}@lanternfish.example`,
      name: 'New',
      passwordHash: 'x'
    });
    expect(user.role).toBe('viewer');
    expect(user.mailPreference).toBe('all');
  });
});

describe('projects', () => {
  it('refuses a duplicate slug', async () => {
    await makeProject('harbour-props');
    await expect(makeProject('harbour-props')).rejects.toBeInstanceOf(UniqueConstraintError);
  });

  it.each([
    { slug: 'tidewatch-props', valid: true },
    { slug: 'a1', valid: true },
    { slug: '9lives', valid: true },
    { slug: 'x'.repeat(63), valid: true },
    { slug: 'x'.repeat(64), valid: false },
    { slug: 'a', valid: false },
    { slug: '-leading-dash', valid: false },
    { slug: 'Upper-Case', valid: false },
    { slug: 'under_score', valid: false },
    { slug: 'dot.ted', valid: false }
  ])('accepts slug "$slug" only when it matches the slug rule ($valid)', async ({ slug, valid }) => {
    const viaModel = Project.create({ slug, name: 'Slug test' });
    if (valid) {
      const project = await viaModel;
      // The database rule agrees with the model rule: remove the row and insert the same slug raw.
      await project.destroy();
      await insertRaw('projects', { slug, name: 'Raw' });
      expect(await Project.count({ where: { slug } })).toBe(1);
    } else {
      await expect(viaModel).rejects.toBeInstanceOf(ValidationError);
      // PostgreSQL refuses a slug over VARCHAR(63) before it reaches the CHECK; SQLite leaves length to the CHECK.
      await expectRefusedByDatabase(insertRaw('projects', { slug, name: 'Raw' }), CHECK_OR_LENGTH_FAILED);
    }
  });

  it('defaults the base branch to main', async () => {
    expect((await makeProject()).baseBranch).toBe('main');
  });
});

describe('memberships', () => {
  it('refuses a second membership for the same user and project', async () => {
    const [user, project] = await Promise.all([makeUser(), makeProject()]);
    await ProjectMembership.create({ projectId: project.id, userId: user.id, role: 'artist' });
    await expect(
      ProjectMembership.create({ projectId: project.id, userId: user.id, role: 'lead' })
    ).rejects.toBeInstanceOf(UniqueConstraintError);
  });

  it('refuses admin as a project role', async () => {
    const [user, project] = await Promise.all([makeUser(), makeProject()]);
    await expect(
      ProjectMembership.create({ projectId: project.id, userId: user.id, role: 'admin' as 'lead' })
    ).rejects.toBeInstanceOf(ValidationError);
    await expectRefusedByDatabase(
      insertRaw('project_memberships', { projectId: project.id, userId: user.id, role: 'admin' }),
      CHECK_FAILED
    );
  });

  it('refuses a membership for a project that does not exist', async () => {
    const user = await makeUser();
    await expect(ProjectMembership.create({ projectId: 999_999, userId: user.id, role: 'viewer' })).rejects.toThrow(
      FOREIGN_KEY_FAILED
    );
  });
});

describe('cascade rules', () => {
  it('deletes everything a project owns with the project', async () => {
    const [user, project] = await Promise.all([makeUser(), makeProject()]);
    await ProjectMembership.create({ projectId: project.id, userId: user.id, role: 'lead' });
    await apiTokens.create(project.id, 'CI', user.id);
    await ProjectPolicy.create({
      projectId: project.id,
      revision: 1,
      policyJson: '{}',
      policyVersion: 'v',
      createdById: user.id
    });
    const build = await makeBuild(project);
    const asset = await Asset.create({
      buildId: build.id,
      path: 'hero.glb',
      contentHash: 'a'.repeat(64),
      byteLength: 10,
      policyVersion: 'v',
      statsJson: null,
      worstRule: null
    });
    const waiver = await Waiver.create({
      projectId: project.id,
      scope: 'rule-asset',
      fingerprint: null,
      rule: 'wide-arc',
      assetPath: 'hero.glb',
      reason: 'intended',
      expiresAt: null,
      proposedById: user.id
    });
    await WaiverEvent.create({ waiverId: waiver.id, userId: user.id, action: 'proposed', note: null });
    await FindingRecord.create({
      buildId: build.id,
      assetId: asset.id,
      assetPath: 'hero.glb',
      rule: 'wide-arc',
      severity: 'warning',
      status: 'new',
      waiverId: waiver.id,
      animation: 'Walk',
      channel: 0,
      node: '/Hero/Hips',
      keyFirst: 3,
      keyLast: 4,
      timeSeconds: 0.125,
      valuesJson: null,
      message: 'm',
      hint: 'h',
      fingerprint: '0123456789abcdef'
    });

    await project.destroy();

    expect(await ProjectMembership.count({ where: { projectId: project.id } })).toBe(0);
    expect(await ApiToken.count({ where: { projectId: project.id } })).toBe(0);
    expect(await ProjectPolicy.count({ where: { projectId: project.id } })).toBe(0);
    expect(await Build.count({ where: { projectId: project.id } })).toBe(0);
    expect(await Asset.count({ where: { buildId: build.id } })).toBe(0);
    expect(await FindingRecord.count({ where: { buildId: build.id } })).toBe(0);
    expect(await Waiver.count({ where: { projectId: project.id } })).toBe(0);
    expect(await WaiverEvent.count({ where: { waiverId: waiver.id } })).toBe(0);
    expect(await User.findByPk(user.id)).not.toBeNull();
  });

  it('keeps a deleted user\u2019s tokens, policies and waivers, with the author set to null', async () => {
    const [user, project] = await Promise.all([makeUser(), makeProject()]);
    await ProjectMembership.create({ projectId: project.id, userId: user.id, role: 'lead' });
    const token = (await ApiToken.findByPk((await apiTokens.create(project.id, 'CI', user.id)).id))!;
    const waiver = await Waiver.create({
      projectId: project.id,
      scope: 'fingerprint',
      fingerprint: 'fedcba9876543210',
      rule: null,
      assetPath: null,
      reason: 'intended',
      expiresAt: null,
      proposedById: user.id
    });

    await user.destroy();

    expect(await ProjectMembership.count({ where: { userId: user.id } })).toBe(0);
    expect((await token.reload()).createdById).toBeNull();
    expect((await waiver.reload()).proposedById).toBeNull();
  });

  it('keeps a build when its baseline build is deleted', async () => {
    const project = await makeProject();
    const baseline = await makeBuild(project);
    const build = await makeBuild(project, 'feature/rope-swing');
    build.baselineBuildId = baseline.id;
    await build.save();
    await baseline.destroy();
    expect((await build.reload()).baselineBuildId).toBeNull();
  });
});

describe('waivers', () => {
  it('needs a fingerprint for a fingerprint waiver, in the model and in the database', async () => {
    const project = await makeProject();
    const fields = {
      projectId: project.id,
      scope: 'fingerprint' as const,
      fingerprint: null,
      rule: null,
      assetPath: null
    };
    await expect(Waiver.create({ ...fields, reason: 'r', expiresAt: null, proposedById: null })).rejects.toBeInstanceOf(
      ValidationError
    );
    await expectRefusedByDatabase(insertRaw('waivers', { ...fields, reason: 'r', status: 'proposed' }), CHECK_FAILED);
  });
});

describe('API tokens', () => {
  it('stores only the SHA-256 of the secret and a short prefix', async () => {
    const project = await makeProject();
    const { id, secret } = await apiTokens.create(project.id, 'CI', null);
    const token = (await ApiToken.findByPk(id))!;
    // FIPS 180-4 SHA-256, computed independently with node:crypto.
    expect(token.tokenHash).toBe(crypto.createHash('sha256').update(secret).digest('hex'));
    expect(secret.startsWith(token.prefix)).toBe(true);
    expect(token.prefix.length).toBeLessThan(secret.length / 2);
    const [row] = await temp.database.sequelize.query<Record<string, unknown>>(
      'SELECT * FROM api_tokens WHERE id = ?',
      {
        replacements: [token.id],
        type: QueryTypes.SELECT
      }
    );
    expect(Object.values(row).some((value) => typeof value === 'string' && value.includes(secret))).toBe(false);
    expect(token.scopes).toBe('submit');
  });

  it('refuses a token hash that is not 64 hex digits in the database', async () => {
    const project = await makeProject();
    await expectRefusedByDatabase(
      insertRaw('api_tokens', {
        projectId: project.id,
        name: 'raw',
        tokenHash: 'plain-secret',
        prefix: 'p',
        scopes: 'submit'
      }),
      CHECK_FAILED
    );
  });
});

/**
 * The migrations on PostgreSQL: the same tables, indexes and CHECK constraints as on SQLite,
 * written for PostgreSQL's quoting, patterns and JSON. Runs in the PostgreSQL pass only
 * (`npm run test:integration:postgres`); migrations.test.ts covers the SQLite side.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes, type Model, type ModelStatic } from 'sequelize';
import { listAppliedMigrations, migrate, MIGRATION_TABLE } from '$lib/server/db/migrate';
import { MIGRATIONS } from '$lib/server/db/migrations';
import { models } from '$lib/server/db/models';
import { openDatabase } from '$lib/server/db/instance';
import { dialectUnderTest, openDatabaseUnderTest, type DatabaseUnderTest } from './helpers/database-under-test';

const isPostgresPass = dialectUnderTest() === 'postgres';

let temp: DatabaseUnderTest;
let firstRun: string[];

beforeAll(async () => {
  if (!isPostgresPass) return;
  temp = await openDatabaseUnderTest({ migrated: false });
  firstRun = await migrate(temp.database.sequelize);
});
afterAll(async () => {
  await temp?.remove();
});

async function rows<T extends object>(sql: string, replacements: unknown[] = []): Promise<T[]> {
  return temp.database.sequelize.query<T>(sql, { type: QueryTypes.SELECT, replacements });
}

/** Inserts a row with raw SQL, bypassing model validation, to reach the database's own constraints. */
async function insertRaw(table: string, row: Record<string, unknown>): Promise<void> {
  const columns = Object.keys(row);
  await temp.database.sequelize.query(
    `INSERT INTO "${table}" (${columns.map((column) => `"${column}"`).join(', ')}) ` +
      `VALUES (${columns.map(() => '?').join(', ')})`,
    { replacements: Object.values(row) }
  );
}

/** The PostgreSQL error raised by `statement`, or null when it succeeded. */
async function failureOf(statement: Promise<unknown>): Promise<{ code?: string; message: string } | null> {
  return statement.then(
    () => null,
    (error: { original?: { code?: string; message: string }; message: string }) => error.original ?? error
  );
}

const now = new Date();
const HASH = 'ab'.repeat(32);

describe.skipIf(!isPostgresPass)('migrations on PostgreSQL', () => {
  it('applies every migration to an empty database and records each one', async () => {
    expect(firstRun).toEqual(MIGRATIONS.map((migration) => migration.name));
    expect(await listAppliedMigrations(temp.database.sequelize)).toEqual(firstRun);
    const recorded = await rows<{ name: string }>(`SELECT name FROM "${MIGRATION_TABLE}" ORDER BY name`);
    expect(recorded.map((row) => row.name)).toEqual(firstRun);
  });

  it('applies nothing when run again on a current database', async () => {
    expect(await migrate(temp.database.sequelize)).toEqual([]);
  });

  it('has a column for every model attribute', async () => {
    for (const model of Object.values(models) as ModelStatic<Model>[]) {
      const columns = await rows<{ column_name: string }>(
        'SELECT column_name FROM information_schema.columns WHERE table_schema = current_schema() AND table_name = ?',
        [model.getTableName() as string]
      );
      expect(
        columns.map((column) => column.column_name),
        model.name
      ).toEqual(expect.arrayContaining(Object.keys(model.getAttributes())));
    }
  });

  it.each([
    ['builds_project_branch_created', 'builds', ['projectId', 'branch', 'createdAt'], false],
    ['builds_project_idempotency_key', 'builds', ['projectId', 'idempotencyKey'], true],
    ['assets_build_path', 'assets', ['buildId', 'path'], true],
    ['findings_build_severity', 'findings', ['buildId', 'severity'], false],
    ['mail_messages_status_next_attempt', 'mail_messages', ['status', 'nextAttemptAt'], false],
    ['asset_side_files_asset_path', 'asset_side_files', ['assetId', 'path'], true]
  ] as const)('creates index %s on %s with its columns and uniqueness', async (name, table, columns, unique) => {
    // pg_index.indkey lists the indexed columns in order; pg_attribute names them (PostgreSQL docs, "System Catalogs").
    const [index] = await rows<{ table_name: string; is_unique: boolean; columns: string[] }>(
      `SELECT t.relname AS table_name, x.indisunique AS is_unique,
              array(SELECT a.attname::text FROM unnest(x.indkey) WITH ORDINALITY AS k(attnum, position)
                    JOIN pg_attribute a ON a.attrelid = t.oid AND a.attnum = k.attnum ORDER BY k.position) AS columns
         FROM pg_index x JOIN pg_class i ON i.oid = x.indexrelid JOIN pg_class t ON t.oid = x.indrelid
        WHERE i.relname = ?`,
      [name]
    );
    expect(index, name).toBeDefined();
    expect(index.table_name).toBe(table);
    expect(index.is_unique).toBe(unique);
    expect(index.columns).toEqual(columns);
  });

  it('makes the same primary keys count up on every table', async () => {
    await insertRaw('users', {
      email: 'first@lanternfish.example',
      name: 'First',
      passwordHash: 'x',
      role: 'viewer',
      createdAt: now,
      updatedAt: now
    });
    await insertRaw('users', {
      email: 'second@lanternfish.example',
      name: 'Second',
      passwordHash: 'x',
      role: 'viewer',
      createdAt: now,
      updatedAt: now
    });
    const ids = await rows<{ id: number }>(`SELECT id FROM users WHERE email LIKE '%@lanternfish.example' ORDER BY id`);
    expect(ids.map((row) => row.id)).toEqual([ids[0].id, ids[0].id + 1]);
  });

  it.each([
    {
      what: 'an upper-case e-mail',
      table: 'users',
      row: {
        email: 'Loud@lanternfish.example',
        name: 'x',
        passwordHash: 'x',
        role: 'viewer',
        createdAt: now,
        updatedAt: now
      }
    },
    {
      what: 'an unknown user role',
      table: 'users',
      row: {
        email: 'owner@lanternfish.example',
        name: 'x',
        passwordHash: 'x',
        role: 'owner',
        createdAt: now,
        updatedAt: now
      }
    },
    {
      what: 'a slug with a capital',
      table: 'projects',
      row: { slug: 'Reef', name: 'x', createdAt: now, updatedAt: now }
    },
    {
      what: 'a slug starting with a dash',
      table: 'projects',
      row: { slug: '-reef', name: 'x', createdAt: now, updatedAt: now }
    },
    { what: 'a one-letter slug', table: 'projects', row: { slug: 'r', name: 'x', createdAt: now, updatedAt: now } },
    {
      what: 'an empty base branch',
      table: 'projects',
      row: { slug: 'reef-b', name: 'x', baseBranch: '', createdAt: now, updatedAt: now }
    }
  ])('refuses $what through a CHECK constraint', async ({ table, row }) => {
    const error = await failureOf(insertRaw(table, row));
    // 23514 is check_violation (PostgreSQL docs, Appendix A "Error Codes").
    expect(error?.code, error?.message).toBe('23514');
  });

  it('accepts a slug, e-mail and token hash that keep the rules', async () => {
    await insertRaw('projects', { slug: 'tidewatch-2', name: 'Tidewatch', createdAt: now, updatedAt: now });
    const [project] = await rows<{ id: number }>(`SELECT id FROM projects WHERE slug = 'tidewatch-2'`);
    await insertRaw('api_tokens', {
      projectId: project.id,
      name: 'CI',
      tokenHash: HASH,
      prefix: 'orx_',
      createdAt: now,
      updatedAt: now
    });
    const error = await failureOf(
      insertRaw('api_tokens', {
        projectId: project.id,
        name: 'CI 2',
        tokenHash: 'AB'.repeat(32),
        prefix: 'orx_',
        createdAt: now,
        updatedAt: now
      })
    );
    expect(error?.code, 'an upper-case token hash').toBe('23514');
  });

  it('refuses policy text that is not JSON and keeps text that is', async () => {
    await insertRaw('projects', { slug: 'kelp-forest', name: 'Kelp', createdAt: now, updatedAt: now });
    const [project] = await rows<{ id: number }>(`SELECT id FROM projects WHERE slug = 'kelp-forest'`);
    const policy = (revision: number, policyJson: string) => ({
      projectId: project.id,
      revision,
      policyJson,
      policyVersion: 'v',
      createdAt: now
    });
    expect(await failureOf(insertRaw('project_policies', policy(1, '{"rules":{}}')))).toBeNull();
    expect((await failureOf(insertRaw('project_policies', policy(2, '{"rules":'))))?.code).toBe('23514');
    expect((await failureOf(insertRaw('project_policies', policy(0, '{}'))))?.code).toBe('23514');
  });

  it('refuses a fingerprint waiver without a fingerprint and a key range that runs backwards', async () => {
    await insertRaw('projects', { slug: 'harbour', name: 'Harbour', createdAt: now, updatedAt: now });
    const [project] = await rows<{ id: number }>(`SELECT id FROM projects WHERE slug = 'harbour'`);
    const waiver = await failureOf(
      insertRaw('waivers', {
        projectId: project.id,
        scope: 'fingerprint',
        reason: 'known',
        status: 'proposed',
        createdAt: now,
        updatedAt: now
      })
    );
    expect(waiver?.code).toBe('23514');
    await insertRaw('builds', {
      projectId: project.id,
      branch: 'main',
      verdict: 'pass',
      policyVersion: 'v',
      engineVersion: 'e',
      createdAt: now
    });
    const [build] = await rows<{ id: number }>('SELECT id FROM builds WHERE "projectId" = ?', [project.id]);
    const finding = (keyFirst: number, keyLast: number) => ({
      buildId: build.id,
      assetPath: 'props/buoy.glb',
      rule: 'unit-drift',
      severity: 'warning',
      status: 'new',
      keyFirst,
      keyLast,
      message: 'm',
      hint: 'h',
      fingerprint: 'f'.repeat(32)
    });
    expect(await failureOf(insertRaw('findings', finding(2, 5)))).toBeNull();
    expect((await failureOf(insertRaw('findings', finding(5, 2))))?.code).toBe('23514');
    const [stored] = await rows<{ waived: boolean }>('SELECT waived FROM findings WHERE "buildId" = ?', [build.id]);
    expect(stored.waived).toBe(false);
  });

  it('deletes a project with its builds through ON DELETE CASCADE', async () => {
    await temp.database.sequelize.query(`DELETE FROM projects WHERE slug = 'harbour'`);
    expect(await rows('SELECT id FROM findings')).toEqual([]);
  });
});

describe.skipIf(!isPostgresPass)('two servers migrating one new PostgreSQL database at once', () => {
  it('applies each migration once while the other waits on the lock', async () => {
    const fresh = await openDatabaseUnderTest({ migrated: false });
    const second = openDatabase(fresh.database.location);
    try {
      const [one, two] = await Promise.all([migrate(fresh.database.sequelize), migrate(second.sequelize)]);
      expect([...one, ...two].sort()).toEqual(MIGRATIONS.map((migration) => migration.name).sort());
      expect(await listAppliedMigrations(second.sequelize)).toEqual(MIGRATIONS.map((migration) => migration.name));
    } finally {
      await second.sequelize.close();
      await fresh.remove();
    }
  });

  it('undoes every migration, newest first, back to an empty schema', async () => {
    const fresh = await openDatabaseUnderTest();
    try {
      const queryInterface = fresh.database.sequelize.getQueryInterface();
      for (const migration of [...MIGRATIONS].reverse()) await migration.down(queryInterface);
      const tables = await fresh.database.sequelize.query<{ table_name: string }>(
        `SELECT table_name FROM information_schema.tables WHERE table_schema = current_schema() AND table_name <> ?`,
        { type: QueryTypes.SELECT, replacements: [MIGRATION_TABLE] }
      );
      expect(tables).toEqual([]);
    } finally {
      await fresh.remove();
    }
  });
});

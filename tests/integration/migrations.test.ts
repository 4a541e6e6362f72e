import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes, type Model, type ModelStatic } from 'sequelize';
import { listAppliedMigrations, migrate, MIGRATION_TABLE } from '$lib/server/db/migrate';
import { MIGRATIONS } from '$lib/server/db/migrations';
import { models } from '$lib/server/db/models';
import { openTempDatabase, type TempDatabase } from './temp-database';

let temp: TempDatabase;
let firstRun: string[];

beforeAll(async () => {
  temp = await openTempDatabase({ migrated: false });
  firstRun = await migrate(temp.database.sequelize);
});
afterAll(async () => {
  await temp.remove();
});

async function rows<T extends object>(sql: string): Promise<T[]> {
  return temp.database.sequelize.query<T>(sql, { type: QueryTypes.SELECT });
}

const TABLES = [
  'users',
  'projects',
  'project_memberships',
  'api_tokens',
  'project_policies',
  'builds',
  'assets',
  'findings',
  'waivers',
  'waiver_events',
  'mail_messages',
  'invitations'
];

/** Indexes the report, trend, waiver and mail queries rely on: name → [columns, unique]. */
const INDEXES: Record<string, [string, string[], boolean]> = {
  builds_project_branch_created: ['builds', ['projectId', 'branch', 'createdAt'], false],
  builds_project_idempotency_key: ['builds', ['projectId', 'idempotencyKey'], true],
  assets_build_path: ['assets', ['buildId', 'path'], true],
  assets_content_policy: ['assets', ['contentHash', 'policyVersion'], false],
  findings_build_severity: ['findings', ['buildId', 'severity'], false],
  findings_build_asset: ['findings', ['buildId', 'assetId'], false],
  findings_fingerprint: ['findings', ['fingerprint'], false],
  waivers_project_fingerprint: ['waivers', ['projectId', 'fingerprint'], false],
  mail_messages_status_next_attempt: ['mail_messages', ['status', 'nextAttemptAt'], false],
  project_memberships_project_user: ['project_memberships', ['projectId', 'userId'], true],
  project_policies_project_revision: ['project_policies', ['projectId', 'revision'], true]
};

describe('database migrations', () => {
  it('applies every migration to an empty database and records each one', async () => {
    expect(firstRun).toEqual(MIGRATIONS.map((migration) => migration.name));
    expect(await listAppliedMigrations(temp.database.sequelize)).toEqual(firstRun);
    const recorded = await rows<{ name: string }>(`SELECT name FROM ${MIGRATION_TABLE} ORDER BY name`);
    expect(recorded.map((row) => row.name)).toEqual(firstRun);
  });

  it('applies nothing when run again on a current database', async () => {
    expect(await migrate(temp.database.sequelize)).toEqual([]);
    expect(await listAppliedMigrations(temp.database.sequelize)).toEqual(firstRun);
  });

  it('creates every table', async () => {
    const tables = await rows<{ name: string }>("SELECT name FROM sqlite_master WHERE type = 'table'");
    expect(tables.map((table) => table.name)).toEqual(expect.arrayContaining([...TABLES, MIGRATION_TABLE]));
  });

  it.each(Object.entries(INDEXES))(
    'creates index %s with its columns and uniqueness',
    async (name, [table, columns, unique]) => {
      const list = await rows<{ name: string; unique: number }>(`PRAGMA index_list(${table})`);
      const entry = list.find((index) => index.name === name);
      expect(entry, `${name} on ${table}`).toBeDefined();
      expect(entry!.unique === 1).toBe(unique);
      const info = await rows<{ seqno: number; name: string }>(`PRAGMA index_info(${name})`);
      expect(info.sort((a, b) => a.seqno - b.seqno).map((column) => column.name)).toEqual(columns);
    }
  );

  it('keeps e-mail, slug and token hash unique through their own indexes', async () => {
    for (const [table, column] of [
      ['users', 'email'],
      ['projects', 'slug'],
      ['api_tokens', 'tokenHash'],
      ['mail_messages', 'dedupeKey'],
      ['invitations', 'tokenHash']
    ]) {
      const list = await rows<{ name: string; unique: number }>(`PRAGMA index_list(${table})`);
      const columnsOfUnique = await Promise.all(
        list
          .filter((index) => index.unique === 1)
          .map((index) => rows<{ name: string }>(`PRAGMA index_info(${index.name})`))
      );
      expect(
        columnsOfUnique.map((info) => info.map((c) => c.name).join(',')),
        `${table}.${column}`
      ).toContain(column);
    }
  });

  it('has a column for every model attribute', async () => {
    for (const model of Object.values(models) as ModelStatic<Model>[]) {
      const columns = await rows<{ name: string }>(`PRAGMA table_info(${model.getTableName() as string})`);
      const names = columns.map((column) => column.name);
      expect(names, model.name).toEqual(expect.arrayContaining(Object.keys(model.getAttributes())));
    }
  });

  it('opens connections in WAL mode with foreign keys and a busy timeout', async () => {
    // SQLite documents journal_mode, foreign_keys and busy_timeout as connection PRAGMAs (sqlite.org/pragma.html).
    expect(await rows<{ journal_mode: string }>('PRAGMA journal_mode')).toEqual([{ journal_mode: 'wal' }]);
    expect(await rows<{ foreign_keys: number }>('PRAGMA foreign_keys')).toEqual([{ foreign_keys: 1 }]);
    const [timeout] = await rows<Record<string, number>>('PRAGMA busy_timeout');
    expect(Object.values(timeout)).toEqual([5000]);
  });

  it('gives a transaction its own connection with the same settings', async () => {
    await temp.database.sequelize.transaction(async (transaction) => {
      const [keys] = await temp.database.sequelize.query<{ foreign_keys: number }>('PRAGMA foreign_keys', {
        type: QueryTypes.SELECT,
        transaction
      });
      expect(keys.foreign_keys).toBe(1);
      const [timeout] = await temp.database.sequelize.query<Record<string, number>>('PRAGMA busy_timeout', {
        type: QueryTypes.SELECT,
        transaction
      });
      expect(Object.values(timeout)).toEqual([5000]);
    });
  });
});

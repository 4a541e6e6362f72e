/**
 * insertRows, the multi-row INSERT a build's assets and findings are written with, against a
 * migrated database (SQLite here, PostgreSQL in the PostgreSQL pass): every kind of value comes
 * back as it went in, long inputs are split over several statements in order, and a malformed
 * row fails before anything is written.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { escapeValues, insertRows } from '$lib/server/db/insert-rows';
import { Asset, FindingRecord, Project } from '$lib/server/db/models';
import { createStoredBuild } from './helpers/stored-build';
import { openTempDatabase, type TempDatabase } from './temp-database';

let temp: TempDatabase;
let buildId: number;
let assetId: number;

const COLUMNS = ['buildId', 'assetId', 'assetPath', 'rule', 'severity', 'animation', 'channel', 'node'] as const;
const MORE_COLUMNS = ['keyFirst', 'keyLast', 'timeSeconds', 'valuesJson', 'message', 'hint', 'fingerprint'] as const;
const STANDING_COLUMNS = ['status', 'waived', 'waiverId'] as const;
const ALL_COLUMNS = [...COLUMNS, ...MORE_COLUMNS, ...STANDING_COLUMNS];

/** A finding row whose text holds what SQL literals must escape: quotes, backslashes, non-ASCII. */
function row(index: number, text = `it's a \\ "quoted" ‘turn’ of 90° 🌊 #${index}`): unknown[] {
  return [
    ...[buildId, assetId, 'props/lamp.glb', 'unit-drift', 'warning', index % 2 === 0 ? null : text, index, text],
    ...[index, index + 3, index / 30 - 0.1, JSON.stringify({ length: 1.0123 }), text, 'Renormalize.', `fp-${index}`],
    ...['new', index % 3 === 0, null]
  ];
}

beforeAll(async () => {
  temp = await openTempDatabase();
  const project = await Project.create({ slug: 'lamp-room', name: 'Lamp Room', baseBranch: 'main' });
  const build = await createStoredBuild(project.id);
  buildId = build.id;
  const asset = await Asset.create({
    buildId,
    path: 'props/lamp.glb',
    contentHash: 'a'.repeat(64),
    byteLength: 10,
    policyVersion: build.policyVersion,
    unreadable: false,
    statsJson: '{}',
    worstRule: null
  });
  assetId = asset.id;
});

afterAll(async () => {
  await temp?.remove();
});

describe('insertRows', () => {
  it('stores strings, numbers, booleans and nulls exactly as given, over several statements in order', async () => {
    const { sequelize } = temp.database;
    // 2,345 rows: three statements of at most 1,000 rows.
    const rows = Array.from({ length: 2345 }, (_, index) => row(index));
    await sequelize.transaction((transaction) =>
      insertRows(sequelize, FindingRecord.getTableName(), ALL_COLUMNS, rows, transaction)
    );
    const stored = await FindingRecord.findAll({ where: { buildId }, order: [['id', 'ASC']] });
    expect(stored).toHaveLength(2345);
    const asRow = (record: FindingRecord) => ALL_COLUMNS.map((column) => record.get(column));
    expect(stored.map(asRow)).toEqual(rows);
    await FindingRecord.destroy({ where: { buildId } });
  });

  it('takes a row partly escaped beforehand, as ingestion prepares finding columns, storing the same', async () => {
    const { sequelize } = temp.database;
    const rows = Array.from({ length: 1200 }, (_, index) => row(index));
    // The first 15 columns escaped ahead, the last three given as values.
    const prepared = rows.map((values) => [escapeValues(sequelize, values.slice(0, 15)), ...values.slice(15)]);
    await sequelize.transaction((transaction) =>
      insertRows(sequelize, FindingRecord.getTableName(), ALL_COLUMNS, prepared, transaction)
    );
    const stored = await FindingRecord.findAll({ where: { buildId }, order: [['id', 'ASC']] });
    expect(stored.map((record) => ALL_COLUMNS.map((column) => record.get(column)))).toEqual(rows);
    await FindingRecord.destroy({ where: { buildId } });
    const tooNarrow = [[escapeValues(sequelize, rows[0].slice(0, 14)), ...rows[0].slice(15)]];
    await expect(
      sequelize.transaction((transaction) =>
        insertRows(sequelize, FindingRecord.getTableName(), ALL_COLUMNS, tooNarrow, transaction)
      )
    ).rejects.toThrow('insertRows: a row of 17 values for 18 columns');
  });

  it('writes nothing and says so when a row has the wrong number of values', async () => {
    const { sequelize } = temp.database;
    const rows = [row(1), row(2).slice(1)];
    await expect(
      sequelize.transaction((transaction) =>
        insertRows(sequelize, FindingRecord.getTableName(), ALL_COLUMNS, rows, transaction)
      )
    ).rejects.toThrow('insertRows: a row of 17 values for 18 columns');
    expect(await FindingRecord.count({ where: { buildId } })).toBe(0);
  });

  it('runs inside the transaction: a statement the database refuses undoes the statements before it', async () => {
    const { sequelize } = temp.database;
    // Statement 1 (rows 0–999) is fine; statement 2 holds a row without its rule (NOT NULL).
    const rows = Array.from({ length: 1500 }, (_, index) => row(index));
    rows[1200][ALL_COLUMNS.indexOf('rule')] = null;
    await expect(
      sequelize.transaction((transaction) =>
        insertRows(sequelize, FindingRecord.getTableName(), ALL_COLUMNS, rows, transaction)
      )
    ).rejects.toThrow(/NOT NULL|null value/i);
    expect(await FindingRecord.count({ where: { buildId } })).toBe(0);
  });

  it('does nothing for no rows', async () => {
    const { sequelize } = temp.database;
    await sequelize.transaction((transaction) =>
      insertRows(sequelize, FindingRecord.getTableName(), ALL_COLUMNS, [], transaction)
    );
    expect(await FindingRecord.count({ where: { buildId } })).toBe(0);
  });
});

/**
 * Names from an uploaded file reach the findings table whatever they hold: NUL, which neither
 * SQLite's inline INSERT text nor PostgreSQL text can carry (it failed the whole build with a
 * 500 before), and lengths far past any real name. Rows are written the way ingestion writes them
 * (findingColumnsOf, one multi-row INSERT) on the database under test: SQLite here, PostgreSQL in
 * the PostgreSQL pass.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { findingColumnsOf } from '$lib/server/builds/finding-columns';
import { Asset, Build, FindingRecord, Project } from '$lib/server/db/models';
import type { Finding } from '$lib/lint/index';
import { openDatabaseUnderTest, type DatabaseUnderTest } from './helpers/database-under-test';

let under: DatabaseUnderTest;
let buildId: number;
let assetId: number;

beforeAll(async () => {
  under = await openDatabaseUnderTest();
  const project = await Project.create({ slug: 'quay', name: 'Quay', baseBranch: 'main' });
  const build = await Build.create({
    projectId: project.id,
    branch: 'main',
    verdict: 'fail',
    policyVersion: 'p1',
    engineVersion: 'e1'
  });
  buildId = build.id;
  const asset = await Asset.create({
    buildId,
    path: 'chars/diver.glb',
    contentHash: 'a'.repeat(64),
    byteLength: 1,
    policyVersion: 'p1'
  });
  assetId = asset.id;
});
afterAll(async () => under?.remove());

/** A not-a-rotation finding with these names and text. */
function findingWith(parts: Pick<Finding, 'animation' | 'node' | 'message' | 'hint'>): Finding {
  return {
    rule: 'not-a-rotation',
    severity: 'error',
    asset: 'chars/diver.glb',
    channel: 0,
    keys: [2, 2],
    time: 1,
    values: { keyIndex: 2 },
    fingerprint: '0123456789abcdef',
    ...parts
  };
}

/** Writes the findings as ingestion does and reads them back in order. */
async function storeAndRead(findings: Finding[]): Promise<FindingRecord[]> {
  const rows = findings.map((finding) => ({
    ...findingColumnsOf(finding),
    buildId,
    assetId,
    status: 'new',
    waived: false,
    waiverId: null
  }));
  await under.database.sequelize.getQueryInterface().bulkInsert(FindingRecord.getTableName(), rows);
  return FindingRecord.findAll({ where: { buildId }, order: [['id', 'DESC']], limit: findings.length });
}

describe('finding rows made from hostile names', () => {
  it('store NUL as U+FFFD in names, messages and hints', async () => {
    const [stored] = await storeAndRead([
      findingWith({
        animation: 'Swim\u0000',
        node: '/Diver/Hi\u0000ps',
        message: 'key 2 of /Diver/Hi\u0000ps is no rotation',
        hint: 'Re-export\u0000.'
      })
    ]);
    expect([stored.animation, stored.node, stored.hint]).toEqual([
      'Swim\ufffd',
      '/Diver/Hi\ufffdps',
      'Re-export\ufffd.'
    ]);
    expect(stored.message).toBe('key 2 of /Diver/Hi\ufffdps is no rotation');
  });

  it('store names and messages far longer than any real one whole', async () => {
    const [stored] = await storeAndRead([
      findingWith({
        animation: 'A'.repeat(70_000),
        node: `/${'🦑'.repeat(35_000)}`,
        message: 'm'.repeat(100_000),
        hint: 'h'
      })
    ]);
    expect(stored.animation).toHaveLength(70_000);
    // 🦑 is one code point in two UTF-16 code units (U+1F991).
    expect(stored.node).toBe(`/${'🦑'.repeat(35_000)}`);
    expect(stored.message).toHaveLength(100_000);
  });

  it('leave ordinary names exactly as they are', async () => {
    const [stored] = await storeAndRead([
      findingWith({ animation: 'Swim', node: '/Diver/Hips', message: 'm', hint: 'h' })
    ]);
    expect([stored.animation, stored.node]).toEqual(['Swim', '/Diver/Hips']);
  });
});

/**
 * The findings a build or an asset still has (new or unchanged, not the fixed ones), in the order
 * they were stored: what a later build is compared with, and what a reused lint takes over.
 * Read as plain rows: a model instance per row cost about as much as the query itself, and a
 * build holds thousands of findings.
 */
import { Op } from 'sequelize';
import type { Finding } from '../../lint/finding';
import { FindingRecord } from '../db/models';
import { FINDING_COLUMN_NAMES, findingOf, type FindingColumns } from './finding-columns';

/** The standing findings of the build `buildId`, or of the stored asset `assetId`. */
export async function findStandingFindings(owner: { buildId: number } | { assetId: number }): Promise<Finding[]> {
  const rows = (await FindingRecord.findAll({
    where: { ...owner, status: { [Op.in]: ['new', 'unchanged'] } },
    attributes: [...FINDING_COLUMN_NAMES],
    order: [['id', 'ASC']],
    raw: true
  })) as unknown as FindingColumns[];
  return rows.map(findingOf);
}

/** What comparing with a baseline needs of each of its findings; the rest is read by id when needed. */
export interface StandingEntry {
  id: number;
  fingerprint: string;
  /** The asset path, as `Finding.asset`. */
  asset: string;
}

/**
 * The standing findings of the build `buildId` as {@link StandingEntry}s, in stored order. Three
 * columns instead of thirteen: a baseline of 5,650 findings read this way cost the upload's
 * thread a few milliseconds instead of about 40, at the start of an upload when that thread is
 * the only one with work.
 */
export async function findStandingEntries(buildId: number): Promise<StandingEntry[]> {
  const rows = (await FindingRecord.findAll({
    where: { buildId, status: { [Op.in]: ['new', 'unchanged'] } },
    attributes: ['id', 'fingerprint', 'assetPath'],
    order: [['id', 'ASC']],
    raw: true
  })) as unknown as { id: number; fingerprint: string; assetPath: string }[];
  return rows.map(({ id, fingerprint, assetPath }) => ({ id, fingerprint, asset: assetPath }));
}

/** The stored findings with these ids, by id (ids that are not stored are absent). */
export async function findFindingsById(ids: readonly number[]): Promise<Map<number, Finding>> {
  const found = new Map<number, Finding>();
  if (ids.length === 0) return found;
  const rows = (await FindingRecord.findAll({
    where: { id: { [Op.in]: [...ids] } },
    attributes: ['id', ...FINDING_COLUMN_NAMES],
    raw: true
  })) as unknown as (FindingColumns & { id: number })[];
  for (const row of rows) found.set(row.id, findingOf(row));
  return found;
}

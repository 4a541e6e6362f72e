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

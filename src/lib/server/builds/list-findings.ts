/**
 * The paged findings of a build, heaviest first, filtered by rule, severity, asset and standing.
 * Standings are disjoint: `waived` findings are not also `new` or `unchanged`, matching the
 * build's counts.
 */
import { literal, type WhereOptions } from 'sequelize';
import { z } from 'zod';
import { SEVERITIES } from '../../lint/finding';
import type { Finding } from '../../lint/finding';
import { FindingRecord } from '../db/models';
import { findingOf } from './finding-columns';

/** A finding's standing as filters and lists show it. */
export const FINDING_STANDINGS = ['new', 'unchanged', 'fixed', 'waived'] as const;
/** One of {@link FINDING_STANDINGS}. */
export type FindingStanding = (typeof FINDING_STANDINGS)[number];

/** Query parameters of the finding list. */
export const listFindingsQuerySchema = z
  .object({
    rule: z.string().max(64).optional(),
    severity: z.enum(SEVERITIES).optional(),
    /** Exact asset path. */
    asset: z.string().max(1024).optional(),
    status: z.enum(FINDING_STANDINGS).optional(),
    page: z.coerce.number().int().min(1).max(100_000).default(1),
    pageSize: z.coerce.number().int().min(1).max(200).default(50)
  })
  .strict();

/** The parsed finding-list query, defaults filled. */
export type ListFindingsQuery = z.output<typeof listFindingsQuerySchema>;

/** A stored finding as the API shows it. */
export interface FindingView extends Finding {
  id: number;
  assetId: number | null;
  /** `new`, `unchanged`, `fixed`, or `waived` (an approved waiver covers it). */
  standing: FindingStanding;
  /** Against the baseline, whatever the waiver. */
  status: 'new' | 'unchanged' | 'fixed';
  waived: boolean;
  waiverId: number | null;
}

/** One page of findings. */
export interface FindingPage {
  findings: FindingView[];
  page: number;
  pageSize: number;
  total: number;
  totalPages: number;
}

/** Lists a page of the build's findings: errors first, then by asset path and position in the asset. */
export async function listFindings(buildId: number, query: ListFindingsQuery): Promise<FindingPage> {
  const where: WhereOptions<FindingRecord> = {
    buildId,
    ...(query.rule === undefined ? {} : { rule: query.rule }),
    ...(query.severity === undefined ? {} : { severity: query.severity }),
    ...(query.asset === undefined ? {} : { assetPath: query.asset }),
    ...standingWhere(query.status)
  };
  const { rows, count } = await FindingRecord.findAndCountAll({
    where,
    order: [
      [literal(`CASE "severity" WHEN 'error' THEN 0 WHEN 'warning' THEN 1 ELSE 2 END`), 'ASC'],
      ['assetPath', 'ASC'],
      ['id', 'ASC']
    ],
    limit: query.pageSize,
    offset: (query.page - 1) * query.pageSize
  });
  return {
    findings: rows.map(toFindingView),
    page: query.page,
    pageSize: query.pageSize,
    total: count,
    totalPages: Math.max(1, Math.ceil(count / query.pageSize))
  };
}

/** The API view of a stored finding. */
export function toFindingView(row: FindingRecord): FindingView {
  return {
    id: row.id,
    assetId: row.assetId,
    ...findingOf(row),
    standing: standingOf(row),
    status: row.status,
    waived: row.waived,
    waiverId: row.waiverId
  };
}

function standingOf(row: FindingRecord): FindingStanding {
  if (row.status === 'fixed') return 'fixed';
  return row.waived ? 'waived' : row.status;
}

function standingWhere(standing: FindingStanding | undefined): WhereOptions<FindingRecord> {
  switch (standing) {
    case undefined:
      return {};
    case 'fixed':
      return { status: 'fixed' };
    case 'waived':
      return { status: ['new', 'unchanged'], waived: true };
    default:
      return { status: standing, waived: false };
  }
}

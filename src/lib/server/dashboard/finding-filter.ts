/**
 * The build report's finding filters as they appear in its URL (`?rule=wide-arc&status=new`),
 * read leniently: a stale or mistyped value in a shared link falls back to "any" instead of an
 * error page. The same names are the API's finding-list parameters, so the page passes them on.
 */
import { z } from 'zod';
import { SEVERITIES } from '../../lint/finding';
import { FINDING_STANDINGS, type ListFindingsQuery } from '../builds/list-findings';

/** Findings per page on the build report. */
export const FINDING_PAGE_SIZE = 50;

const findingFilterSchema = z.object({
  rule: z.string().trim().min(1).max(64).optional().catch(undefined),
  severity: z.enum(SEVERITIES).optional().catch(undefined),
  asset: z.string().min(1).max(1024).optional().catch(undefined),
  status: z.enum(FINDING_STANDINGS).optional().catch(undefined),
  page: z.coerce.number().int().min(1).max(100_000).default(1).catch(1)
});

/** The filters and page of the build report's findings table. */
export type FindingFilter = z.output<typeof findingFilterSchema>;

/** Reads the findings table's filters from URL search parameters (unknown parameters are ignored). */
export function parseFindingFilter(searchParams: URLSearchParams): FindingFilter {
  return findingFilterSchema.parse(Object.fromEntries(searchParams));
}

/** The finding-list query for a filter, at the report's page size. */
export function findingQueryOf(filter: FindingFilter): ListFindingsQuery {
  return { ...filter, pageSize: FINDING_PAGE_SIZE };
}

/**
 * The project builds page's table: a page of builds filtered by branch and verdict and sorted by
 * time, verdict or new findings. The API's build list sorts by time and open errors only; the
 * table also lets a reader put failed builds or the builds with most new findings on top.
 */
import { literal, type Order } from 'sequelize';
import { z } from 'zod';
import { Build } from '../db/models';
import { summarizeBuild, type BuildSummary } from '../builds/build-summary';

/** Columns the table sorts by. */
export const BUILD_TABLE_SORTS = ['time', 'verdict', 'new'] as const;
export type BuildTableSort = (typeof BUILD_TABLE_SORTS)[number];

/** Rows per page of the builds table. */
export const BUILD_TABLE_PAGE_SIZE = 25;

/**
 * The table's URL query. Lenient on purpose: a shared link with a stale or mistyped value shows
 * the default for that value instead of an error page.
 */
export const buildTableQuerySchema = z.object({
  branch: z.string().trim().min(1).max(255).optional().catch(undefined),
  verdict: z.enum(['pass', 'fail']).optional().catch(undefined),
  sort: z.enum(BUILD_TABLE_SORTS).default('time').catch('time'),
  /** `desc`: newest, failed or most new findings first. */
  order: z.enum(['asc', 'desc']).default('desc').catch('desc'),
  page: z.coerce.number().int().min(1).max(100_000).default(1).catch(1)
});

export type BuildTableQuery = z.output<typeof buildTableQuerySchema>;

/** One page of the builds table. */
export interface BuildTablePage {
  builds: BuildSummary[];
  page: number;
  pageSize: number;
  total: number;
  totalPages: number;
}

/** Reads the table's query from URL search parameters (unknown parameters are ignored). */
export function parseBuildTableQuery(searchParams: URLSearchParams): BuildTableQuery {
  return buildTableQuerySchema.parse(Object.fromEntries(searchParams));
}

/** A page of the project's builds for the table. Ties always fall back to newest first, so pages never overlap. */
export async function listBuildTable(
  project: { id: number; slug: string },
  query: BuildTableQuery,
  origin: string
): Promise<BuildTablePage> {
  const where = {
    projectId: project.id,
    ...(query.branch === undefined ? {} : { branch: query.branch }),
    ...(query.verdict === undefined ? {} : { verdict: query.verdict })
  };
  const direction = query.order === 'asc' ? 'ASC' : 'DESC';
  const newestLast: Order = [
    ['createdAt', direction],
    ['id', direction]
  ];
  const newestFirst: Order = [
    ['createdAt', 'DESC'],
    ['id', 'DESC']
  ];
  const order: Order =
    query.sort === 'time'
      ? newestLast
      : query.sort === 'verdict'
        ? [[literal(`CASE "verdict" WHEN 'fail' THEN 1 ELSE 0 END`), direction], ...newestFirst]
        : [['newCount', direction], ...newestFirst];
  const { rows, count } = await Build.findAndCountAll({
    where,
    order,
    limit: BUILD_TABLE_PAGE_SIZE,
    offset: (query.page - 1) * BUILD_TABLE_PAGE_SIZE
  });
  return {
    builds: rows.map((build) => summarizeBuild(build, project.slug, origin)),
    page: query.page,
    pageSize: BUILD_TABLE_PAGE_SIZE,
    total: count,
    totalPages: Math.max(1, Math.ceil(count / BUILD_TABLE_PAGE_SIZE))
  };
}

/**
 * The paged build list of a project, newest first by default, filtered by branch and verdict.
 */
import { z } from 'zod';
import { Build } from '../db/models';
import { summarizeBuild, type BuildSummary } from './build-summary';

/** Query parameters of the build list. */
export const listBuildsQuerySchema = z
  .object({
    branch: z.string().max(255).optional(),
    verdict: z.enum(['pass', 'fail']).optional(),
    page: z.coerce.number().int().min(1).max(100_000).default(1),
    pageSize: z.coerce.number().int().min(1).max(100).default(20),
    /** `newest` (default), `oldest`, or `errors` (most open errors first, then newest). */
    sort: z.enum(['newest', 'oldest', 'errors']).default('newest')
  })
  .strict();

/** The parsed build-list query, defaults filled. */
export type ListBuildsQuery = z.output<typeof listBuildsQuerySchema>;

/** One page of builds. */
export interface BuildPage {
  builds: BuildSummary[];
  page: number;
  pageSize: number;
  total: number;
  totalPages: number;
}

const ORDER = {
  newest: [
    ['createdAt', 'DESC'],
    ['id', 'DESC']
  ],
  oldest: [
    ['createdAt', 'ASC'],
    ['id', 'ASC']
  ],
  errors: [
    ['errorCount', 'DESC'],
    ['createdAt', 'DESC'],
    ['id', 'DESC']
  ]
} as const satisfies Record<ListBuildsQuery['sort'], [string, 'ASC' | 'DESC'][]>;

/** Lists a page of the project's builds. */
export async function listBuilds(
  project: { id: number; slug: string },
  query: ListBuildsQuery,
  origin: string
): Promise<BuildPage> {
  const where = {
    projectId: project.id,
    ...(query.branch === undefined ? {} : { branch: query.branch }),
    ...(query.verdict === undefined ? {} : { verdict: query.verdict })
  };
  const { rows, count } = await Build.findAndCountAll({
    where,
    order: ORDER[query.sort].map(([column, direction]) => [column, direction]),
    limit: query.pageSize,
    offset: (query.page - 1) * query.pageSize
  });
  return {
    builds: rows.map((build) => summarizeBuild(build, project.slug, origin)),
    page: query.page,
    pageSize: query.pageSize,
    total: count,
    totalPages: Math.max(1, Math.ceil(count / query.pageSize))
  };
}

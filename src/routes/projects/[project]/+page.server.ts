import { requireProjectRole } from '$lib/server/auth/require-project-role';
import { listBuildTable, parseBuildTableQuery } from '$lib/server/dashboard/list-build-table';
import { listProjectBranches } from '$lib/server/dashboard/list-project-branches';
import type { PageServerLoad } from './$types';

/** The project's builds: one page of the table as the URL query asks, and the branches for the filter. */
export const load: PageServerLoad = async ({ locals, params, url }) => {
  const { project } = await requireProjectRole(locals, params.project, 'viewer');
  const query = parseBuildTableQuery(url.searchParams);
  const [table, branches] = await Promise.all([
    listBuildTable(project, query, url.origin),
    listProjectBranches(project)
  ]);
  return { query, table, branches };
};

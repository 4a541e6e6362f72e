import { requireProjectRole } from '$lib/server/auth/require-project-role';
import { getBuildDetail } from '$lib/server/builds/get-build-detail';
import { getProjectBuild } from '$lib/server/builds/get-project-build';
import { listFindings } from '$lib/server/builds/list-findings';
import { findingQueryOf, parseFindingFilter } from '$lib/server/dashboard/finding-filter';
import { listFindingFacets } from '$lib/server/dashboard/list-finding-facets';
import { rethrowAsPageError } from '$lib/server/dashboard/rethrow-as-page-error';
import { isProjectRoleAtLeast } from '$lib/types/roles';
import type { PageServerLoad } from './$types';

/**
 * A build's report: verdict, baseline, counts and assets, the first page of its findings as the
 * URL's filters ask, and what the filters can offer. Later filter changes read the API directly.
 */
export const load: PageServerLoad = async ({ locals, params, url }) => {
  const { project, role } = await requireProjectRole(locals, params.project, 'viewer');
  const build = await getProjectBuild(project.id, params.id).catch(rethrowAsPageError);
  const filter = parseFindingFilter(url.searchParams);
  const [detail, findings, facets] = await Promise.all([
    getBuildDetail(build, project.slug, url.origin),
    listFindings(build.id, findingQueryOf(filter)),
    listFindingFacets(build.id)
  ]);
  return { detail, filter, findings, facets, canProposeWaiver: isProjectRoleAtLeast(role, 'artist') };
};

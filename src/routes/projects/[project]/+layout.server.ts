import { listVisibleProjects } from '$lib/server/auth/project-access';
import { requireProjectRole } from '$lib/server/auth/require-project-role';
import { requireUser } from '$lib/server/auth/require-user';
import type { ProjectRole } from '$lib/types/roles';
import type { LayoutServerLoad } from './$types';

/** What every page of one project shares: the project, the user's role in it and the projects for the switcher. */
export interface ProjectLayoutData {
  project: { slug: string; name: string; baseBranch: string };
  /** The user's role in this project; admins count as leads. */
  role: ProjectRole;
  isAdmin: boolean;
  /** Projects the user can see, for the top bar's project switcher. */
  projects: { slug: string; name: string }[];
}

/** Guards every page under one project (viewers and up; non-members get 404) and returns what they share. */
export const load: LayoutServerLoad = async ({ locals, params }): Promise<ProjectLayoutData> => {
  const { project, role, isAdmin } = await requireProjectRole(locals, params.project, 'viewer');
  const visible = await listVisibleProjects(requireUser(locals));
  return {
    project: { slug: project.slug, name: project.name, baseBranch: project.baseBranch },
    role,
    isAdmin,
    projects: visible.map((item) => ({ slug: item.slug, name: item.name }))
  };
};

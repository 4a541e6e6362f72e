import { isProjectRoleAtLeast, type ProjectRole } from '../../types/roles';
import type { SessionUser } from '../../types/session-user';
import { Project, ProjectMembership } from '../db/models';
import { ForbiddenError, NotFoundError } from '../errors';

/** A user's standing in one project. Admins act as leads everywhere. */
export interface ProjectAccess {
  project: Project;
  role: ProjectRole;
  isAdmin: boolean;
}

/**
 * What `user` may do in the project `slug`, checked against `minimumRole`.
 * Admins see every project. For everyone else membership decides whether the project exists
 * for them at all: a non-member gets the same NotFoundError as for an unknown slug, so project
 * names do not leak; a member below `minimumRole` gets a ForbiddenError.
 */
export async function getProjectAccess(
  user: SessionUser,
  slug: string,
  minimumRole: ProjectRole = 'viewer'
): Promise<ProjectAccess> {
  const notFound = new NotFoundError(
    'project.not-found',
    `There is no project "${slug}", or you are not a member of it.`
  );
  const project = await Project.findOne({ where: { slug } });
  if (!project) throw notFound;
  if (user.role === 'admin') return { project, role: 'lead', isAdmin: true };
  const membership = await ProjectMembership.findOne({ where: { projectId: project.id, userId: user.id } });
  if (!membership) throw notFound;
  if (!isProjectRoleAtLeast(membership.role, minimumRole)) {
    throw new ForbiddenError(
      'project.role-required',
      `This needs the ${minimumRole} role in ${project.name}; you are ${article(membership.role)} ${membership.role}. Ask a project lead.`
    );
  }
  return { project, role: membership.role, isAdmin: false };
}

/** Projects `user` can see, by name: all of them for admins, their memberships for everyone else. */
export async function listVisibleProjects(user: SessionUser): Promise<Project[]> {
  if (user.role === 'admin') return Project.findAll({ order: [['name', 'ASC']] });
  const memberships = await ProjectMembership.findAll({ where: { userId: user.id }, attributes: ['projectId'] });
  if (memberships.length === 0) return [];
  return Project.findAll({ where: { id: memberships.map((m) => m.projectId) }, order: [['name', 'ASC']] });
}

function article(role: ProjectRole): string {
  return role === 'artist' ? 'an' : 'a';
}

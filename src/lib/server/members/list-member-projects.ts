/**
 * The projects in which a user holds at least a given role (all projects for admins), for pages
 * that are open to "artists and up somewhere", such as the ad-hoc check.
 */
import { Op } from 'sequelize';
import { PROJECT_ROLES, isProjectRoleAtLeast, type ProjectRole } from '../../types/roles';
import type { SessionUser } from '../../types/session-user';
import { Project, ProjectMembership } from '../db/models';

/** The projects where `user` is at least `minimumRole`, by name. */
export async function listMemberProjects(user: SessionUser, minimumRole: ProjectRole): Promise<Project[]> {
  if (user.role === 'admin') return Project.findAll({ order: [['name', 'ASC']] });
  const roles = PROJECT_ROLES.filter((role) => isProjectRoleAtLeast(role, minimumRole));
  const memberships = await ProjectMembership.findAll({
    where: { userId: user.id, role: { [Op.in]: roles } },
    attributes: ['projectId']
  });
  if (memberships.length === 0) return [];
  return Project.findAll({
    where: { id: memberships.map((membership) => membership.projectId) },
    order: [['name', 'ASC']]
  });
}

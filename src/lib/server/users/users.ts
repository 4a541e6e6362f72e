/**
 * Accounts as admins manage them: the list with each person's projects, disabling and enabling
 * an account, and changing the site-wide role. Import as a namespace: `users.list()`.
 * Accounts are never deleted (history keeps its authors), and the site always keeps one active
 * admin, so an admin cannot lock everyone out by accident.
 */
import { z } from 'zod';
import { USER_ROLES, type ProjectRole, type UserRole } from '../../types/roles';
import { Project, ProjectMembership, User } from '../db/models';
import { InputError, NotFoundError } from '../errors';

/** One account as the admin list shows it. */
export interface UserView {
  id: number;
  name: string;
  email: string;
  role: UserRole;
  isDisabled: boolean;
  disabledAt: string | null;
  createdAt: string;
  projects: { slug: string; name: string; role: ProjectRole }[];
}

/** Changing a site-wide role. */
export const changeUserRoleSchema = z.object({
  userId: z.coerce.number('Pick a user.').int().positive('Pick a user.'),
  role: z.enum(USER_ROLES, 'Choose admin, lead, artist or viewer.')
});

/** Disabling or enabling an account. */
export const setDisabledSchema = z.object({
  userId: z.coerce.number('Pick a user.').int().positive('Pick a user.')
});

/** Every account, by name, with its project memberships. */
export async function list(): Promise<UserView[]> {
  const users = await User.findAll({ order: [['name', 'ASC']] });
  const memberships = await ProjectMembership.findAll({
    include: [{ model: Project, as: 'project', attributes: ['slug', 'name'] }]
  });
  const byUser = new Map<number, UserView['projects']>();
  for (const membership of memberships) {
    const project = (membership as ProjectMembership & { project: Project }).project;
    const projects = byUser.get(membership.userId) ?? [];
    projects.push({ slug: project.slug, name: project.name, role: membership.role });
    byUser.set(membership.userId, projects);
  }
  return users.map((user) => ({
    id: user.id,
    name: user.name,
    email: user.email,
    role: user.role,
    isDisabled: user.disabledAt !== null,
    disabledAt: user.disabledAt?.toISOString() ?? null,
    createdAt: user.createdAt.toISOString(),
    projects: (byUser.get(user.id) ?? []).sort((a, b) => a.name.localeCompare(b.name))
  }));
}

/**
 * Disables or enables an account. A disabled account loses access on its next request.
 * @throws NotFoundError for an unknown id; InputError for one's own account or the last active admin.
 */
export async function setDisabled(actorId: number, userId: number, isDisabled: boolean): Promise<User> {
  const user = await find(userId);
  if (isDisabled) {
    if (user.id === actorId) {
      throw new InputError('user.self', 'You cannot disable your own account.', {
        userId: 'You cannot disable your own account; ask another admin.'
      });
    }
    if (user.role === 'admin') await requireAnotherAdmin(user, 'disable');
  }
  if ((user.disabledAt !== null) !== isDisabled) await user.update({ disabledAt: isDisabled ? new Date() : null });
  return user;
}

/**
 * Changes an account's site-wide role (admins see everything; for others it is the default of new memberships).
 * @throws NotFoundError for an unknown id; InputError when it would leave no active admin.
 */
export async function changeRole(actorId: number, userId: number, role: UserRole): Promise<User> {
  const user = await find(userId);
  if (user.role === role) return user;
  if (user.role === 'admin') await requireAnotherAdmin(user, user.id === actorId ? 'step down as' : 'demote');
  await user.update({ role });
  return user;
}

async function find(userId: number): Promise<User> {
  const user = await User.findByPk(userId);
  if (!user) throw new NotFoundError('user.not-found', `There is no user ${userId}. Reload the list.`);
  return user;
}

async function requireAnotherAdmin(user: User, what: string): Promise<void> {
  const activeAdmins = await User.count({ where: { role: 'admin', disabledAt: null } });
  if (activeAdmins > 1 || user.disabledAt !== null) return;
  throw new InputError('user.last-admin', `You cannot ${what} the last active admin.`, {
    userId: `${user.name} is the last active admin; make someone else admin first.`
  });
}

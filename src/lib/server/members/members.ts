/**
 * A project's members and their roles, managed by its leads and admins from the project
 * settings. Import as a namespace: `members.list(...)`, `members.add(...)`. Only existing
 * accounts can be added (an admin invites new people); a project always keeps at least one
 * lead, so nobody can lock the team out of its own settings.
 */
import { z } from 'zod';
import { PROJECT_ROLES, type ProjectRole } from '../../types/roles';
import { ProjectMembership, User } from '../db/models';
import { InputError, NotFoundError } from '../errors';

/** One member as the settings page lists them. */
export interface MemberView {
  membershipId: number;
  userId: number;
  name: string;
  email: string;
  role: ProjectRole;
  /** Disabled accounts stay listed (history keeps its authors) but cannot sign in. */
  isDisabled: boolean;
  /** The account is a site admin: it can do everything in the project whatever its role here. */
  isAdmin: boolean;
  since: string;
}

/** The project a change applies to. */
export interface MemberProject {
  id: number;
  name: string;
}

/** Adding someone: their e-mail address and project role. */
export const addMemberSchema = z.object({
  email: z
    .string('Enter the person’s e-mail address.')
    .trim()
    .toLowerCase()
    .pipe(z.email('Enter an e-mail address such as name@studio.example.')),
  role: z.enum(PROJECT_ROLES, 'Choose lead, artist or viewer.')
});

/** Changing a member's role. */
export const changeRoleSchema = z.object({
  membershipId: z.coerce.number('Pick a member.').int().positive('Pick a member.'),
  role: z.enum(PROJECT_ROLES, 'Choose lead, artist or viewer.')
});

/** Removing a member. */
export const removeMemberSchema = z.object({
  membershipId: z.coerce.number('Pick a member.').int().positive('Pick a member.')
});

/** The project's members, leads first, then by name. */
export async function list(projectId: number): Promise<MemberView[]> {
  const memberships = await ProjectMembership.findAll({
    where: { projectId },
    include: [{ model: User, as: 'user', attributes: ['id', 'name', 'email', 'role', 'disabledAt'] }]
  });
  const rank: Record<ProjectRole, number> = { lead: 0, artist: 1, viewer: 2 };
  return memberships
    .map((membership) => {
      const user = (membership as ProjectMembership & { user: User }).user;
      return {
        membershipId: membership.id,
        userId: user.id,
        name: user.name,
        email: user.email,
        role: membership.role,
        isDisabled: user.disabledAt !== null,
        isAdmin: user.role === 'admin',
        since: membership.createdAt.toISOString()
      };
    })
    .sort((a, b) => rank[a.role] - rank[b.role] || a.name.localeCompare(b.name));
}

/**
 * Adds an existing account to the project.
 * @throws InputError (field `email`) for an unknown address or someone already a member.
 */
export async function add(project: MemberProject, input: z.output<typeof addMemberSchema>): Promise<MemberView> {
  const user = await User.findOne({ where: { email: input.email } });
  if (!user) {
    throw new InputError('member.unknown-user', `No account uses ${input.email}.`, {
      email: `No account uses ${input.email}. An admin can invite them first.`
    });
  }
  const existing = await ProjectMembership.findOne({ where: { projectId: project.id, userId: user.id } });
  if (existing) {
    throw new InputError('member.exists', `${user.name} is already a member of ${project.name}.`, {
      email: `${user.name} is already a member (${existing.role}); change their role in the list instead.`
    });
  }
  const membership = await ProjectMembership.create({ projectId: project.id, userId: user.id, role: input.role });
  return {
    membershipId: membership.id,
    userId: user.id,
    name: user.name,
    email: user.email,
    role: membership.role,
    isDisabled: user.disabledAt !== null,
    isAdmin: user.role === 'admin',
    since: membership.createdAt.toISOString()
  };
}

/**
 * Changes a member's role.
 * @throws NotFoundError for a membership of another project; InputError when it would leave no lead.
 */
export async function changeRole(project: MemberProject, membershipId: number, role: ProjectRole): Promise<void> {
  const membership = await find(project, membershipId);
  if (membership.role === role) return;
  if (membership.role === 'lead') await requireAnotherLead(project, membershipId, 'change the role of');
  await membership.update({ role });
}

/**
 * Removes a member from the project (their account stays).
 * @throws NotFoundError for a membership of another project; InputError when it would leave no lead.
 */
export async function remove(project: MemberProject, membershipId: number): Promise<void> {
  const membership = await find(project, membershipId);
  if (membership.role === 'lead') await requireAnotherLead(project, membershipId, 'remove');
  await membership.destroy();
}

async function find(project: MemberProject, membershipId: number): Promise<ProjectMembership> {
  const membership = await ProjectMembership.findOne({ where: { id: membershipId, projectId: project.id } });
  if (!membership) {
    throw new NotFoundError('member.not-found', `${project.name} has no member ${membershipId}. Reload the list.`);
  }
  return membership;
}

async function requireAnotherLead(project: MemberProject, membershipId: number, what: string): Promise<void> {
  const leads = await ProjectMembership.count({ where: { projectId: project.id, role: 'lead' } });
  if (leads > 1) return;
  throw new InputError(
    'member.last-lead',
    `You cannot ${what} the last lead of ${project.name}: make someone else lead first.`,
    { membershipId: `The last lead of ${project.name} stays a lead; make someone else lead first.` }
  );
}

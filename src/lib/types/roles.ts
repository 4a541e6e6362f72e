/**
 * Roles a person can hold. Shared by the server (checks, database constraints) and the UI (labels, menus).
 */

/** A user's own role: `admin` sees and manages everything; the others are the default for new memberships. */
export const USER_ROLES = ['admin', 'lead', 'artist', 'viewer'] as const;
export type UserRole = (typeof USER_ROLES)[number];

/** A role inside one project, weakest last: leads approve waivers and edit policy, artists submit, viewers read. */
export const PROJECT_ROLES = ['lead', 'artist', 'viewer'] as const;
export type ProjectRole = (typeof PROJECT_ROLES)[number];

/** Rank of a project role for "at least" checks: higher can do more. */
export const PROJECT_ROLE_RANK: Record<ProjectRole, number> = { lead: 3, artist: 2, viewer: 1 };

/** True when `role` grants at least what `minimum` grants. */
export function isProjectRoleAtLeast(role: ProjectRole, minimum: ProjectRole): boolean {
  return PROJECT_ROLE_RANK[role] >= PROJECT_ROLE_RANK[minimum];
}

import { listMemberProjects } from '$lib/server/members/list-member-projects';
import type { LayoutServerLoad } from './$types';

/**
 * Every page gets the signed-in user (or null on /signin) for the header and menus, and whether
 * the Quick check page is theirs to use (admins, and artists or leads of some project), so the
 * navigation does not offer viewers a page that refuses them.
 */
export const load: LayoutServerLoad = async ({ locals }) => {
  const user = locals.user;
  if (!user) return { user, canQuickCheck: false };
  const canQuickCheck = user.role === 'admin' || (await listMemberProjects(user, 'artist')).length > 0;
  return { user, canQuickCheck };
};

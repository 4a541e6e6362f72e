import type { LayoutServerLoad } from './$types';

/** Every page gets the signed-in user (or null on /signin) for the header and menus. */
export const load: LayoutServerLoad = async ({ locals }) => {
  return { user: locals.user };
};

import { requireUser } from '$lib/server/auth/require-user';
import { listProjectOverviews } from '$lib/server/projects/project-overview';
import type { HomePageData } from '$lib/types/project-overview';
import type { PageServerLoad } from './$types';

/** Home: every project the user can see, with its latest verdict, open findings and trend. */
export const load: PageServerLoad = async ({ locals }): Promise<HomePageData> => {
  const user = requireUser(locals);
  return { projects: await listProjectOverviews(user) };
};

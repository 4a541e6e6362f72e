import { error } from '@sveltejs/kit';
import { requireUser } from '$lib/server/auth/require-user';
import { listMemberProjects } from '$lib/server/members/list-member-projects';
import * as policyRevisions from '$lib/server/policies/policy-revisions';
import type { PageServerLoad } from './$types';

/**
 * The ad-hoc check: open to admins and to artists and leads of at least one project. It sends the
 * policies of those projects, so a file can be linted as its project's CI would; the files themselves
 * never reach the server.
 */
export const load: PageServerLoad = async ({ locals }) => {
  const user = requireUser(locals);
  const projects = await listMemberProjects(user, 'artist');
  if (projects.length === 0 && user.role !== 'admin') {
    error(403, {
      message: 'Checking files needs the artist or lead role in at least one project. Ask a project lead.',
      code: 'project.role-required'
    });
  }
  const policies = await Promise.all(
    projects.map(async (project) => {
      const current = await policyRevisions.getCurrent(project.id);
      return { slug: project.slug, name: project.name, revision: current.revision, policy: current.policy };
    })
  );
  return { policies };
};

/** `/admin` opens the admin area on its users page (admins only; others get 403). */
import { redirect } from '@sveltejs/kit';
import { requireAdmin } from '$lib/server/users/require-admin';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ locals }) => {
  requireAdmin(locals);
  redirect(303, '/admin/users');
};

import { fail } from '@sveltejs/kit';
import { fieldErrorsOf } from '$lib/components/field-errors';
import { formValues } from '$lib/components/form-values';
import { InputError, NotFoundError } from '$lib/server/errors';
import * as invitations from '$lib/server/invitations/invitations';
import { requireAdmin } from '$lib/server/users/require-admin';
import * as users from '$lib/server/users/users';
import type { Actions, PageServerLoad } from './$types';

/** Every account with its projects, and recent invitations. Admins only. */
export const load: PageServerLoad = async ({ locals }) => {
  requireAdmin(locals);
  const [userList, invitationList] = await Promise.all([users.list(), invitations.list()]);
  return { users: userList, invitations: invitationList };
};

export const actions: Actions = {
  /** Invites an e-mail address; the answer holds the one-time link. */
  invite: async ({ locals, request, url }) => {
    const admin = requireAdmin(locals);
    const values = formValues(await request.formData(), ['email', 'role']);
    const parsed = invitations.inviteSchema.safeParse(values);
    if (!parsed.success)
      return fail(400, { form: 'invite' as const, fieldErrors: fieldErrorsOf(parsed.error), values });
    try {
      const invitation = await invitations.create(parsed.data, admin.id, new Date(), { linkOrigin: url.origin });
      return {
        form: 'invite' as const,
        invitation: {
          email: invitation.email,
          role: invitation.role,
          expiresAt: invitation.expiresAt,
          link: `${url.origin}/invite/${invitation.token}`
        }
      };
    } catch (error) {
      if (error instanceof InputError)
        return fail(400, { form: 'invite' as const, fieldErrors: error.fieldErrors, values });
      throw error;
    }
  },

  /** Ends a pending invitation. */
  withdraw: async ({ locals, request }) => {
    requireAdmin(locals);
    const invitationId = Number((await request.formData()).get('invitationId'));
    if (!Number.isSafeInteger(invitationId) || invitationId <= 0) {
      return fail(400, { form: 'invitations' as const, error: 'Pick an invitation.' });
    }
    await invitations.withdraw(invitationId);
    return { form: 'invitations' as const, message: 'The invitation link no longer works.' };
  },

  /** Disables or enables an account. */
  setDisabled: async ({ locals, request }) => {
    const admin = requireAdmin(locals);
    const values = formValues(await request.formData(), ['userId', 'disabled']);
    const parsed = users.setDisabledSchema.safeParse(values);
    if (!parsed.success) return fail(400, { form: 'users' as const, error: fieldErrorsOf(parsed.error).userId });
    return change(async () => {
      const user = await users.setDisabled(admin.id, parsed.data.userId, values.disabled === 'true');
      return user.disabledAt ? `${user.name} is disabled and signed out.` : `${user.name} can sign in again.`;
    });
  },

  /** Changes an account's site-wide role. */
  changeRole: async ({ locals, request }) => {
    const admin = requireAdmin(locals);
    const parsed = users.changeUserRoleSchema.safeParse(formValues(await request.formData(), ['userId', 'role']));
    if (!parsed.success)
      return fail(400, { form: 'users' as const, error: Object.values(fieldErrorsOf(parsed.error))[0] });
    return change(async () => {
      const user = await users.changeRole(admin.id, parsed.data.userId, parsed.data.role);
      return `${user.name} is now ${user.role === 'artist' || user.role === 'admin' ? 'an' : 'a'} ${user.role}.`;
    });
  }
};

/** Runs an account change, turning its expected refusals into a form failure. */
async function change(work: () => Promise<string>) {
  try {
    return { form: 'users' as const, message: await work() };
  } catch (error) {
    if (error instanceof InputError || error instanceof NotFoundError) {
      return fail(error.status, { form: 'users' as const, error: error.message });
    }
    throw error;
  }
}

import { fail } from '@sveltejs/kit';
import { fieldErrorsOf } from '$lib/components/field-errors';
import { formValues } from '$lib/components/form-values';
import { requireUser } from '$lib/server/auth/require-user';
import { InputError } from '$lib/server/errors';
import { PASSWORD_MIN_LENGTH } from '$lib/server/invitations/invitations';
import { getMailSettings, mailSettingsSchema, saveMailSettings } from '$lib/server/mail/mail-settings';
import type { Actions, PageServerLoad } from './$types';
import { changePassword, changePasswordSchema } from './change-password.server';

/** The signed-in person's account: who they are, their password and which build e-mails they get. */
export const load: PageServerLoad = async ({ locals }) => {
  const user = requireUser(locals);
  return { account: user, mail: await getMailSettings(user.id), passwordMinLength: PASSWORD_MIN_LENGTH };
};

export const actions: Actions = {
  /** Changes the password after checking the current one. */
  password: async ({ locals, request }) => {
    const user = requireUser(locals);
    const parsed = changePasswordSchema.safeParse(
      formValues(await request.formData(), ['currentPassword', 'password', 'passwordAgain'])
    );
    if (!parsed.success) return fail(400, { form: 'password' as const, fieldErrors: fieldErrorsOf(parsed.error) });
    try {
      await changePassword(user.id, parsed.data);
    } catch (error) {
      if (error instanceof InputError) {
        return fail(400, { form: 'password' as const, fieldErrors: error.fieldErrors });
      }
      throw error;
    }
    return { form: 'password' as const, message: 'Password changed. Use the new one next time you sign in.' };
  },

  /** Saves the mail preference and the per-project subscriptions. */
  mail: async ({ locals, request }) => {
    const user = requireUser(locals);
    const form = await request.formData();
    const parsed = mailSettingsSchema.safeParse({
      preference: form.get('preference'),
      projectIds: form.getAll('projectId').filter((value) => typeof value === 'string')
    });
    if (!parsed.success) return fail(400, { form: 'mail' as const, fieldErrors: fieldErrorsOf(parsed.error) });
    await saveMailSettings(user.id, parsed.data);
    return { form: 'mail' as const, message: 'Mail settings saved.' };
  }
};

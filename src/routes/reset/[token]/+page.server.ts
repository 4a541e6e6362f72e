import { fail } from '@sveltejs/kit';
import { fieldErrorsOf } from '$lib/components/field-errors';
import { formValues } from '$lib/components/form-values';
import { PASSWORD_MIN_LENGTH } from '$lib/server/invitations/invitations';
import * as passwordReset from '$lib/server/mail/password-reset';
import type { Actions, PageServerLoad } from './$types';

/** The link from a reset e-mail: the new-password form, or why the link no longer works. */
export const load: PageServerLoad = async ({ params }) => {
  return { lookup: await passwordReset.lookUp(params.token), passwordMinLength: PASSWORD_MIN_LENGTH };
};

export const actions: Actions = {
  /** Sets the new password; the link stops working. */
  default: async ({ params, request }) => {
    const values = formValues(await request.formData(), ['password', 'passwordAgain']);
    const parsed = passwordReset.newPasswordSchema.safeParse(values);
    if (!parsed.success) return fail(400, { fieldErrors: fieldErrorsOf(parsed.error) });
    const result = await passwordReset.complete(params.token, parsed.data.password);
    if (result.status !== 'valid') return fail(400, { lookup: result });
    return { changedFor: result.email };
  }
};

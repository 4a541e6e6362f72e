import { fail } from '@sveltejs/kit';
import { fieldErrorsOf } from '$lib/components/field-errors';
import { formValues } from '$lib/components/form-values';
import * as passwordReset from '$lib/server/mail/password-reset';
import type { Actions } from './$types';

export const actions: Actions = {
  /**
   * Asks for a reset link. The answer is the same whether or not an account uses the address,
   * so the form tells nobody which addresses have accounts.
   */
  default: async ({ request, url }) => {
    const values = formValues(await request.formData(), ['email']);
    const parsed = passwordReset.requestResetSchema.safeParse(values);
    if (!parsed.success) return fail(400, { fieldErrors: fieldErrorsOf(parsed.error), values });
    await passwordReset.request(parsed.data.email, url.origin);
    return { sentTo: parsed.data.email };
  }
};

import { fail } from '@sveltejs/kit';
import { fieldErrorsOf } from '$lib/components/field-errors';
import { formValues } from '$lib/components/form-values';
import { InputError } from '$lib/server/errors';
import * as invitations from '$lib/server/invitations/invitations';
import type { Actions, PageServerLoad } from './$types';

/**
 * An invitation link: who it is for while it is usable, or a plain "used" or "expired" message.
 * Open without signing in (the link is the credential); nothing is revealed for an unknown token.
 */
export const load: PageServerLoad = async ({ params, locals }) => {
  return {
    invitation: await invitations.lookUp(params.token),
    minPasswordLength: invitations.PASSWORD_MIN_LENGTH,
    signedInAs: locals.user?.email ?? null
  };
};

export const actions: Actions = {
  /** Creates the account: name and password (typed twice). */
  default: async ({ params, request }) => {
    const values = formValues(await request.formData(), ['name', 'password', 'passwordAgain']);
    // Passwords never travel back to the page; the name does.
    const kept = { name: values.name };
    const parsed = invitations.acceptSchema.safeParse(values);
    if (!parsed.success) return fail(400, { fieldErrors: fieldErrorsOf(parsed.error), values: kept });
    try {
      const user = await invitations.accept(params.token, parsed.data);
      return { accepted: { email: user.email, name: user.name } };
    } catch (error) {
      if (error instanceof InputError) return fail(409, { error: error.message, fieldErrors: {}, values: kept });
      throw error;
    }
  }
};

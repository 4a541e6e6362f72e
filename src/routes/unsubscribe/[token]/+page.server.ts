import { fail } from '@sveltejs/kit';
import * as unsubscribeLink from '$lib/server/mail/unsubscribe-link';
import type { Actions, PageServerLoad } from './$types';

/** The unsubscribe link from a build e-mail: a confirmation page; nothing changes on opening it. */
export const load: PageServerLoad = async ({ params }) => {
  return { lookup: await unsubscribeLink.lookUp(params.token) };
};

export const actions: Actions = {
  /**
   * Unsubscribes. The page's button posts here, and so does a mail client's one-click request
   * (RFC 8058: `List-Unsubscribe=One-Click` in the body), which needs no session either.
   */
  default: async ({ params }) => {
    const lookup = await unsubscribeLink.confirm(params.token);
    if (lookup.status !== 'valid') return fail(400, { lookup });
    return { lookup };
  }
};

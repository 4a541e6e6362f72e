import { error } from '@sveltejs/kit';
import * as outboxView from '$lib/server/mail/mail-outbox-view';
import type { PageServerLoad } from './$types';
import { requireAdmin } from '../../require-admin.server';

/** One message the local catcher received, exactly as it arrived. */
export const load: PageServerLoad = async ({ locals, params }) => {
  requireAdmin(locals);
  const id = Number(params.id);
  const caught = Number.isSafeInteger(id) && id > 0 ? await outboxView.getCaught(id) : null;
  if (!caught) error(404, { message: `There is no caught message ${params.id}.`, code: 'mail.not-found' });
  return { caught };
};

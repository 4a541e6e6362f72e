import { error } from '@sveltejs/kit';
import * as outboxView from '$lib/server/mail/mail-outbox-view';
import type { PageServerLoad } from './$types';
import { requireAdmin } from '../../require-admin.server';

/** One outbox message: its delivery state and its content as queued. */
export const load: PageServerLoad = async ({ locals, params }) => {
  requireAdmin(locals);
  const id = Number(params.id);
  const message = Number.isSafeInteger(id) && id > 0 ? await outboxView.getMessage(id) : null;
  if (!message) error(404, { message: `There is no outbox message ${params.id}.`, code: 'mail.not-found' });
  return { message };
};

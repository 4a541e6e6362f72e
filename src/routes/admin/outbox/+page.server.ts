import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import { getConfig } from '$lib/server/config';
import { MAIL_STATUSES } from '$lib/server/db/models/mail-message';
import * as outboxView from '$lib/server/mail/mail-outbox-view';
import type { Actions, PageServerLoad } from './$types';
import { requireAdmin } from './require-admin.server';

const statusSchema = z.enum(MAIL_STATUSES).optional().catch(undefined);

/** The outbox (optionally one status) and the messages the local catcher received. */
export const load: PageServerLoad = async ({ locals, url }) => {
  requireAdmin(locals);
  const status = statusSchema.parse(url.searchParams.get('status') ?? undefined);
  const { smtpUrl } = getConfig().mail;
  return {
    status: status ?? null,
    listing: await outboxView.list({ status }),
    delivery: smtpUrl ? { mode: 'smtp' as const, host: new URL(smtpUrl).host } : { mode: 'catcher' as const }
  };
};

export const actions: Actions = {
  /** Queues a failed message again with fresh attempts. */
  retry: async ({ locals, request }) => {
    requireAdmin(locals);
    const id = Number((await request.formData()).get('messageId'));
    if (!Number.isSafeInteger(id) || id <= 0) return fail(400, { error: 'Pick a message.' });
    if (!(await outboxView.retry(id))) return fail(400, { error: `Message ${id} is not failed; nothing to retry.` });
    return { message: `Message ${id} is queued again.` };
  }
};

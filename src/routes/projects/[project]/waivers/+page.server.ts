import { fail } from '@sveltejs/kit';
import { fieldErrorsOf } from '$lib/components/field-errors';
import { formValues } from '$lib/components/form-values';
import { requireProjectRole } from '$lib/server/auth/require-project-role';
import { requireUser } from '$lib/server/auth/require-user';
import { listRuleCatalog } from '$lib/server/policies/rule-catalog';
import { findWaivableFinding } from '$lib/server/waivers/find-waivable-finding';
import { listWaiverEvents } from '$lib/server/waivers/list-waiver-events';
import { listWaivers } from '$lib/server/waivers/list-waivers';
import { WaiverNotFoundError, WaiverStateError } from '$lib/server/waivers/waiver-errors';
import { proposeWaiverSchema, waiverDecisionSchema } from '$lib/server/waivers/waiver-input';
import * as waivers from '$lib/server/waivers/waivers';
import { isProjectRoleAtLeast } from '$lib/types/roles';
import type { Actions, PageServerLoad } from './$types';

/** What the propose form starts with: from a build report's "Propose waiver" link, or empty. */
function prefillOf(url: URL) {
  const text = (name: string) => (url.searchParams.get(name) ?? '').trim().slice(0, 1024);
  const fingerprint = text('fingerprint').toLowerCase();
  return {
    scope: fingerprint || !text('rule') ? 'fingerprint' : 'rule-asset',
    fingerprint,
    rule: text('rule'),
    assetPath: text('asset'),
    reason: '',
    expiresOn: ''
  };
}

/** Waivers of the project grouped by state, their history, and the proposal form's starting values. */
export const load: PageServerLoad = async ({ locals, params, url }) => {
  const { project, role } = await requireProjectRole(locals, params.project, 'viewer');
  const prefill = prefillOf(url);
  const [list, events, finding] = await Promise.all([
    listWaivers(project.id),
    listWaiverEvents(project.id),
    prefill.fingerprint ? findWaivableFinding(project.id, prefill.fingerprint) : null
  ]);
  return {
    waivers: list,
    events,
    prefill,
    finding,
    rules: listRuleCatalog().map(({ id, title }) => ({ id, title })),
    canPropose: isProjectRoleAtLeast(role, 'artist'),
    canDecide: isProjectRoleAtLeast(role, 'lead')
  };
};

export const actions: Actions = {
  /** Proposes a waiver (artists and up). */
  propose: async ({ locals, params, request }) => {
    const { project, role } = await requireProjectRole(locals, params.project, 'artist');
    const values = formValues(await request.formData(), [
      'scope',
      'fingerprint',
      'rule',
      'assetPath',
      'reason',
      'expiresOn'
    ]);
    const parsed = proposeWaiverSchema.safeParse(values);
    if (!parsed.success)
      return fail(400, { form: 'propose' as const, fieldErrors: fieldErrorsOf(parsed.error), values });
    try {
      const waiver = await waivers.propose(project, { user: requireUser(locals), role }, parsed.data);
      return {
        form: 'propose' as const,
        message: `Waiver ${waiver.id} proposed; a lead of ${project.name} decides on it.`
      };
    } catch (error) {
      if (error instanceof WaiverStateError) {
        return fail(400, { form: 'propose' as const, fieldErrors: { expiresOn: error.message }, values });
      }
      throw error;
    }
  },

  /** Approves, rejects or revokes a waiver (leads and admins). */
  decide: async ({ locals, params, request }) => {
    const { project, role } = await requireProjectRole(locals, params.project, 'lead');
    const form = await request.formData();
    const waiverId = Number(form.get('waiverId'));
    const parsed = waiverDecisionSchema.safeParse(formValues(form, ['action', 'note']));
    if (!Number.isSafeInteger(waiverId) || waiverId <= 0 || !parsed.success) {
      const fieldErrors = parsed.success ? { waiverId: 'Pick a waiver.' } : fieldErrorsOf(parsed.error);
      return fail(400, { form: 'decide' as const, waiverId, fieldErrors, error: Object.values(fieldErrors)[0] });
    }
    try {
      await waivers.decide(project, { user: requireUser(locals), role }, waiverId, parsed.data);
      return { form: 'decide' as const, waiverId, message: `Waiver ${waiverId} ${PAST[parsed.data.action]}.` };
    } catch (error) {
      if (error instanceof WaiverStateError || error instanceof WaiverNotFoundError) {
        return fail(error.status, { form: 'decide' as const, waiverId, fieldErrors: {}, error: error.message });
      }
      throw error;
    }
  }
};

const PAST = { approve: 'approved', reject: 'rejected', revoke: 'revoked' } as const;

import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import { fieldErrorsOf } from '$lib/components/field-errors';
import { formValues } from '$lib/components/form-values';
import { requireProjectRole } from '$lib/server/auth/require-project-role';
import { requireUser } from '$lib/server/auth/require-user';
import { InputError, NotFoundError } from '$lib/server/errors';
import { ApiError } from '$lib/server/ingest/api-error';
import * as members from '$lib/server/members/members';
import { baseBranchSchema, setBaseBranch } from '$lib/server/policies/base-branch';
import * as policyRevisions from '$lib/server/policies/policy-revisions';
import { listRuleCatalog } from '$lib/server/policies/rule-catalog';
import * as apiTokens from '$lib/server/tokens/api-tokens';
import type { Actions, PageServerLoad } from './$types';
import { parsePolicyForm, policyFieldGroups, valuesOfForm, valuesOfPolicy } from './policy-form';

const tokenNameSchema = z.object({
  name: z
    .string()
    .trim()
    .min(1, 'Name the token after where it is used, such as “CI main”.')
    .max(100, 'Keep the name under 100 characters.')
});
const tokenIdSchema = z.object({ tokenId: z.coerce.number().int().positive('Pick a token.') });

/** Everything a lead configures: the policy, the base branch, API tokens and members. Leads and admins only. */
export const load: PageServerLoad = async ({ locals, params }) => {
  const { project } = await requireProjectRole(locals, params.project, 'lead');
  const groups = policyFieldGroups();
  const [current, history, tokens, memberList] = await Promise.all([
    policyRevisions.getCurrent(project.id),
    policyRevisions.listHistory(project.id),
    apiTokens.list(project.id),
    members.list(project.id)
  ]);
  const { policy, ...revision } = current;
  return {
    policy: { revision, values: valuesOfPolicy(policy, groups), history },
    rules: listRuleCatalog(),
    tokens,
    members: memberList
  };
};

export const actions: Actions = {
  /** Saves the policy form as a new revision. */
  savePolicy: async ({ locals, params, request }) => {
    const { project } = await requireProjectRole(locals, params.project, 'lead');
    const groups = policyFieldGroups();
    const values = valuesOfForm(await request.formData(), groups);
    const parsed = parsePolicyForm(values, groups);
    if (!parsed.policy) return fail(400, { form: 'policy' as const, fieldErrors: parsed.fieldErrors, values });
    const { current, isUnchanged } = await policyRevisions.save(project.id, parsed.policy, requireUser(locals).id);
    return {
      form: 'policy' as const,
      message: isUnchanged
        ? `No changes: revision ${current.revision} stays current.`
        : `Saved revision ${current.revision}. The next build is linted under it.`
    };
  },

  /** Changes the base branch. */
  setBaseBranch: async ({ locals, params, request }) => {
    const { project } = await requireProjectRole(locals, params.project, 'lead');
    const values = formValues(await request.formData(), ['baseBranch']);
    const parsed = baseBranchSchema.safeParse(values);
    if (!parsed.success) {
      return fail(400, { form: 'baseBranch' as const, fieldErrors: fieldErrorsOf(parsed.error), values });
    }
    await setBaseBranch(project.id, parsed.data.baseBranch);
    return { form: 'baseBranch' as const, message: `Builds now compare against ${parsed.data.baseBranch}.` };
  },

  /** Creates an API token; its secret is in this answer only. */
  createToken: async ({ locals, params, request }) => {
    const { project } = await requireProjectRole(locals, params.project, 'lead');
    const values = formValues(await request.formData(), ['name']);
    const parsed = tokenNameSchema.safeParse(values);
    if (!parsed.success) return fail(400, { form: 'token' as const, fieldErrors: fieldErrorsOf(parsed.error), values });
    const token = await apiTokens.create(project.id, parsed.data.name, requireUser(locals).id);
    return { form: 'token' as const, createdToken: { id: token.id, name: token.name, secret: token.secret } };
  },

  /** Revokes an API token. */
  revokeToken: async ({ locals, params, request }) => {
    const { project } = await requireProjectRole(locals, params.project, 'lead');
    const parsed = tokenIdSchema.safeParse(formValues(await request.formData(), ['tokenId']));
    if (!parsed.success) return fail(400, { form: 'token' as const, fieldErrors: fieldErrorsOf(parsed.error) });
    try {
      const token = await apiTokens.revoke(project.id, parsed.data.tokenId);
      return {
        form: 'token' as const,
        message: `Revoked ${token.name} (${token.prefix}…). CI jobs using it now get 403.`
      };
    } catch (error) {
      if (error instanceof ApiError) return fail(error.status, { form: 'token' as const, error: error.message });
      throw error;
    }
  },

  /** Adds an existing account as a member. */
  addMember: async ({ locals, params, request }) => {
    const { project } = await requireProjectRole(locals, params.project, 'lead');
    const values = formValues(await request.formData(), ['email', 'role']);
    const parsed = members.addMemberSchema.safeParse(values);
    if (!parsed.success) {
      return fail(400, { form: 'addMember' as const, fieldErrors: fieldErrorsOf(parsed.error), values });
    }
    return memberChange('addMember', values, async () => {
      const member = await members.add(project, parsed.data);
      return `Added ${member.name} as ${member.role}.`;
    });
  },

  /** Changes a member's role. */
  changeRole: async ({ locals, params, request }) => {
    const { project } = await requireProjectRole(locals, params.project, 'lead');
    const parsed = members.changeRoleSchema.safeParse(formValues(await request.formData(), ['membershipId', 'role']));
    if (!parsed.success) return fail(400, { form: 'members' as const, fieldErrors: fieldErrorsOf(parsed.error) });
    return memberChange('members', {}, async () => {
      await members.changeRole(project, parsed.data.membershipId, parsed.data.role);
      return 'Role changed.';
    });
  },

  /** Removes a member from the project. */
  removeMember: async ({ locals, params, request }) => {
    const { project } = await requireProjectRole(locals, params.project, 'lead');
    const parsed = members.removeMemberSchema.safeParse(formValues(await request.formData(), ['membershipId']));
    if (!parsed.success) return fail(400, { form: 'members' as const, fieldErrors: fieldErrorsOf(parsed.error) });
    return memberChange('members', {}, async () => {
      await members.remove(project, parsed.data.membershipId);
      return 'Member removed.';
    });
  }
};

/** Runs a membership change, turning its expected refusals into form failures. */
async function memberChange<F extends 'addMember' | 'members'>(
  form: F,
  values: Record<string, string>,
  change: () => Promise<string>
) {
  try {
    return { form, message: await change() };
  } catch (error) {
    if (error instanceof InputError || error instanceof NotFoundError) {
      const fieldErrors = error instanceof InputError ? error.fieldErrors : {};
      return fail(error.status, { form, fieldErrors, values, error: error.message });
    }
    throw error;
  }
}

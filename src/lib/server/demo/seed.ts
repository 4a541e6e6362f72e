import { parsePolicy, policyVersionOf } from '../../lint/policy';
import { hashPassword } from '../auth/password';
import { Project, ProjectMembership, ProjectPolicy, User } from '../db/models';
import * as apiTokens from '../tokens/api-tokens';
import { getDemoPolicy, type DemoProjectSlug } from './assets';
import { DEMO_ACCOUNTS, DEMO_PROJECTS, type DemoAccount } from './demo-accounts';

/** A demo project's CI token, to print and to post the build history with. */
export interface DemoToken {
  projectSlug: string;
  secret: string;
}

/** What the demo seed made: the accounts (with their public demo passwords) and one token per project. */
export interface DemoSeed {
  accounts: readonly DemoAccount[];
  tokens: DemoToken[];
}

/**
 * Fills an empty, migrated database with the Lanternfish Interactive scenario: users of every
 * role, the three Tidewatch projects with memberships, a first policy revision and one CI token
 * each. Builds are not made here: they arrive through the real ingestion routes (see history.ts).
 */
export async function seedDemo(): Promise<DemoSeed> {
  const users = new Map<string, User>();
  for (const account of DEMO_ACCOUNTS) {
    const user = await User.create({
      email: account.email,
      name: account.name,
      role: account.role,
      passwordHash: await hashPassword(account.password)
    });
    users.set(account.email, user);
  }
  const admin = DEMO_ACCOUNTS.find((account) => account.role === 'admin');
  const adminId = admin ? (users.get(admin.email)?.id ?? null) : null;

  const tokens: DemoToken[] = [];
  for (const demo of DEMO_PROJECTS) {
    const project = await Project.create({ slug: demo.slug, name: demo.name, baseBranch: demo.baseBranch });
    for (const [email, role] of Object.entries(demo.members)) {
      const user = users.get(email);
      if (!user) throw new Error(`Demo project ${demo.slug} lists ${email}, who is not a demo account.`);
      await ProjectMembership.create({ projectId: project.id, userId: user.id, role });
    }
    // The story's rule overrides on top of the project's base policy: the gate stops the builds it should.
    const policy = parsePolicy(getDemoPolicy(demo.slug as DemoProjectSlug));
    await ProjectPolicy.create({
      projectId: project.id,
      revision: 1,
      policyJson: JSON.stringify(policy),
      policyVersion: policyVersionOf(policy),
      createdById: adminId
    });
    const { secret } = await apiTokens.create(project.id, 'CI (demo)', adminId);
    tokens.push({ projectSlug: demo.slug, secret });
  }
  return { accounts: DEMO_ACCOUNTS, tokens };
}

/**
 * Saving a project's lint policy: each save that changes the policy appends the next revision,
 * also when two leads save at the same moment (on SQLite and in the PostgreSQL pass).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parsePolicy } from '$lib/lint/policy';
import { Project, ProjectPolicy, User } from '$lib/server/db/models';
import { hashPassword } from '$lib/server/auth/password';
import * as policyRevisions from '$lib/server/policies/policy-revisions';
import { openTempDatabase, type TempDatabase } from './temp-database';

let temp: TempDatabase;
let project: Project;
let lead: User;

beforeAll(async () => {
  temp = await openTempDatabase();
  project = await Project.create({ slug: 'tidewatch-props', name: 'Tidewatch Props', baseBranch: 'main' });
  lead = await User.create({
    email: 'priya@lanternfish.example',
    name: 'Priya Castellane',
    role: 'lead',
    passwordHash: await hashPassword('tidewatch-lead')
  });
});

afterAll(async () => {
  await temp.remove();
});

describe('saving policy revisions', () => {
  it('appends revision 1, and leaves an unchanged policy alone', async () => {
    const policy = parsePolicy({ wideArcDegrees: 140 });
    const first = await policyRevisions.save(project.id, policy, lead.id);
    expect(first).toMatchObject({ isUnchanged: false, current: { revision: 1 } });
    const again = await policyRevisions.save(project.id, policy, lead.id);
    expect(again).toMatchObject({ isUnchanged: true, current: { revision: 1 } });
  });

  it('gives two saves at the same moment consecutive revisions, not a unique-index error', async () => {
    const saves = [130, 120, 110, 100].map((degrees) =>
      policyRevisions.save(project.id, parsePolicy({ wideArcDegrees: degrees }), lead.id)
    );
    const results = await Promise.all(saves);
    expect(results.every((result) => !result.isUnchanged)).toBe(true);
    const revisions = (
      await ProjectPolicy.findAll({ where: { projectId: project.id }, order: [['revision', 'ASC']] })
    ).map((row) => row.revision);
    expect(revisions).toEqual([1, 2, 3, 4, 5]);
  });
});

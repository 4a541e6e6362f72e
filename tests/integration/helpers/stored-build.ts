import type { InferCreationAttributes } from 'sequelize';
import { defaultPolicy, policyVersionOf } from '$lib/lint/policy';
import { ENGINE_VERSION } from '$lib/lint/version';
import { Build } from '$lib/server/db/models';

/**
 * Stores a build row for a test that needs one in the database: a passing build on `main` with
 * no commit, label, job link, key or baseline, under the default policy and this engine, unless
 * `columns` says otherwise.
 */
export function createStoredBuild(
  projectId: number,
  columns: Partial<InferCreationAttributes<Build>> = {}
): Promise<Build> {
  return Build.create({
    projectId,
    branch: 'main',
    commitSha: null,
    label: null,
    ciJobUrl: null,
    idempotencyKey: null,
    verdict: 'pass',
    verdictReason: null,
    baselineBuildId: null,
    policyVersion: policyVersionOf(defaultPolicy()),
    engineVersion: ENGINE_VERSION,
    durationMs: null,
    ...columns
  });
}

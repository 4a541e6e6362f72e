/**
 * The lint policy a stored build was linted under, for plots that draw the policy's tolerances
 * and for fixes that must use the same ones. Builds keep only the policy's version hash, so the
 * project's saved revision with that hash is looked up.
 */
import { defaultPolicy, parsePolicy, policyVersionOf, type Policy } from '../../lint/policy';
import type { Build } from '../db/models';
import { ProjectPolicy } from '../db/models';
import { findProjectPolicy } from '../builds/find-project-policy';

/** The build's policy, and whether it is exactly the one the build used. */
export interface BuildPolicy {
  policy: Policy;
  /**
   * False when no saved revision matches the build's policy version (a revision edited away by
   * hand): the project's current policy stands in, and the page says so.
   */
  isExact: boolean;
}

/** The policy `build` was linted under: its saved revision, the default policy, or else the project's current one. */
export async function findBuildPolicy(build: Build): Promise<BuildPolicy> {
  const revision = await ProjectPolicy.findOne({
    where: { projectId: build.projectId, policyVersion: build.policyVersion },
    order: [['revision', 'DESC']]
  });
  if (revision) return { policy: parsePolicy(JSON.parse(revision.policyJson)), isExact: true };
  const fallback = defaultPolicy();
  if (policyVersionOf(fallback) === build.policyVersion) return { policy: fallback, isExact: true };
  return { policy: await findProjectPolicy(build.projectId), isExact: false };
}

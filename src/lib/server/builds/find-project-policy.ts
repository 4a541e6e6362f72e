/**
 * The lint policy a project builds under now: its highest saved revision, or the default
 * policy before anyone saved one.
 */
import { defaultPolicy, parsePolicy, type Policy } from '../../lint/policy';
import { ProjectPolicy } from '../db/models';

/**
 * Reads and validates the project's current policy.
 * @throws PolicyError when the stored revision no longer validates (a bug or a hand edit).
 */
export async function findProjectPolicy(projectId: number): Promise<Policy> {
  const latest = await ProjectPolicy.findOne({ where: { projectId }, order: [['revision', 'DESC']] });
  if (!latest) return defaultPolicy();
  return parsePolicy(JSON.parse(latest.policyJson));
}

/**
 * Saved revisions of a project's lint policy: the current one with who saved it, the list of
 * earlier ones, and saving a new one. Import as a namespace: `policyRevisions.save(...)`.
 * Revisions are append-only; ingestion lints every build under the highest one
 * (builds/find-project-policy.ts), and each build records the version it was linted under.
 */
import { defaultPolicy, parsePolicy, policyVersionOf, type Policy } from '../../lint/policy';
import { Project, ProjectPolicy, User } from '../db/models';

/** A revision as the settings page and the API show it. Revision 0 stands for the defaults before any save. */
export interface PolicyRevisionView {
  revision: number;
  policyVersion: string;
  savedBy: { id: number; name: string } | null;
  savedAt: string | null;
}

/** The current policy with its revision. */
export interface CurrentPolicy extends PolicyRevisionView {
  policy: Policy;
}

/** Most revisions one history answer lists. */
export const POLICY_HISTORY_LIMIT = 20;

/**
 * The project's current policy: its highest revision, or the defaults as revision 0.
 * @throws PolicyError when the stored revision no longer validates.
 */
export async function getCurrent(projectId: number): Promise<CurrentPolicy> {
  const latest = await ProjectPolicy.findOne({
    where: { projectId },
    include: [{ model: User, as: 'createdBy', attributes: ['id', 'name'] }],
    order: [['revision', 'DESC']]
  });
  if (!latest) {
    const policy = defaultPolicy();
    return { revision: 0, policyVersion: policyVersionOf(policy), savedBy: null, savedAt: null, policy };
  }
  return { ...toView(latest), policy: parsePolicy(JSON.parse(latest.policyJson)) };
}

/** The newest revisions, newest first. */
export async function listHistory(projectId: number, limit = POLICY_HISTORY_LIMIT): Promise<PolicyRevisionView[]> {
  const revisions = await ProjectPolicy.findAll({
    where: { projectId },
    include: [{ model: User, as: 'createdBy', attributes: ['id', 'name'] }],
    order: [['revision', 'DESC']],
    limit
  });
  return revisions.map(toView);
}

/**
 * Saves `policy` (already validated) as the next revision, unless it equals the current one.
 * Returns the current revision and whether a new one was written.
 */
export async function save(
  projectId: number,
  policy: Policy,
  savedById: number
): Promise<{ current: PolicyRevisionView; isUnchanged: boolean }> {
  const policyVersion = policyVersionOf(policy);
  const sequelize = ProjectPolicy.sequelize;
  if (!sequelize) throw new Error('The ProjectPolicy model is not bound to a database; open the database first.');
  // Two saves at once must get consecutive revisions: SQLite's IMMEDIATE transactions serialise
  // writers already; on PostgreSQL the project row's lock does (SELECT ... FOR UPDATE).
  const saved = await sequelize.transaction(async (transaction) => {
    if (sequelize.getDialect() === 'postgres') {
      await Project.findByPk(projectId, { transaction, lock: transaction.LOCK.UPDATE });
    }
    const latest = await ProjectPolicy.findOne({ where: { projectId }, order: [['revision', 'DESC']], transaction });
    if (latest?.policyVersion === policyVersion) return null;
    if (!latest && policyVersion === policyVersionOf(defaultPolicy())) return null;
    return ProjectPolicy.create(
      {
        projectId,
        revision: (latest?.revision ?? 0) + 1,
        policyJson: JSON.stringify(policy),
        policyVersion,
        createdById: savedById
      },
      { transaction }
    );
  });
  const current = await getCurrent(projectId);
  return { current: withoutPolicy(current), isUnchanged: saved === null };
}

function toView(revision: ProjectPolicy): PolicyRevisionView {
  const savedBy = (revision as ProjectPolicy & { createdBy?: User | null }).createdBy;
  return {
    revision: revision.revision,
    policyVersion: revision.policyVersion,
    savedBy: savedBy ? { id: savedBy.id, name: savedBy.name } : null,
    savedAt: revision.createdAt.toISOString()
  };
}

function withoutPolicy({ revision, policyVersion, savedBy, savedAt }: CurrentPolicy): PolicyRevisionView {
  return { revision, policyVersion, savedBy, savedAt };
}

/**
 * The build a new build is compared with: the latest build on the project's base branch.
 * For a build on the base branch itself that is its predecessor there, since the new build is
 * not stored yet when this runs.
 */
import { Op } from 'sequelize';
import { Build } from '../db/models';

/** The latest base-branch build of the project created before `before` (default: now), or null. */
export async function findBaselineBuild(
  project: { id: number; baseBranch: string },
  before: Date = new Date()
): Promise<Build | null> {
  return Build.findOne({
    where: { projectId: project.id, branch: project.baseBranch, createdAt: { [Op.lte]: before } },
    order: [
      ['createdAt', 'DESC'],
      ['id', 'DESC']
    ]
  });
}

/**
 * The branches a project has builds on, for the builds table's branch filter.
 */
import { fn, col } from 'sequelize';
import { Build } from '../db/models';

/** A branch and how many builds it has. */
export interface ProjectBranch {
  name: string;
  buildCount: number;
}

/** The project's branches: the base branch first, then the others by name. */
export async function listProjectBranches(project: { id: number; baseBranch: string }): Promise<ProjectBranch[]> {
  const rows = (await Build.findAll({
    attributes: ['branch', [fn('COUNT', col('id')), 'buildCount']],
    where: { projectId: project.id },
    group: ['branch'],
    raw: true
  })) as unknown as { branch: string; buildCount: number }[];
  return rows
    .map((row) => ({ name: row.branch, buildCount: Number(row.buildCount) }))
    .sort((a, b) =>
      a.name === project.baseBranch ? -1 : b.name === project.baseBranch ? 1 : a.name.localeCompare(b.name)
    );
}

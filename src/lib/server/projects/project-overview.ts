import { Op } from 'sequelize';
import type { LatestBuildSummary, ProjectOverview, TrendPoint } from '../../types/project-overview';
import type { SessionUser } from '../../types/session-user';
import { listVisibleProjects } from '../auth/project-access';
import { Build, type Project } from '../db/models';

/** Number of base-branch builds in a project's trend. */
export const TREND_LENGTH = 20;

/**
 * The home page's cards: each project `user` can see, with its latest build (any branch),
 * the open findings of its latest base-branch build and the base-branch trend. Three small
 * indexed queries per project (builds by project, branch and time), never a findings scan.
 */
export async function listProjectOverviews(user: SessionUser): Promise<ProjectOverview[]> {
  const projects = await listVisibleProjects(user);
  return Promise.all(projects.map((project) => getProjectOverview(project)));
}

/** One project's card; see {@link listProjectOverviews}. */
export async function getProjectOverview(project: Project): Promise<ProjectOverview> {
  const [latest, baseBuilds] = await Promise.all([
    Build.findOne({
      where: { projectId: project.id },
      order: [
        ['createdAt', 'DESC'],
        ['id', 'DESC']
      ]
    }),
    Build.findAll({
      where: { projectId: project.id, branch: { [Op.eq]: project.baseBranch } },
      order: [
        ['createdAt', 'DESC'],
        ['id', 'DESC']
      ],
      limit: TREND_LENGTH,
      attributes: ['id', 'createdAt', 'errorCount', 'warningCount', 'infoCount']
    })
  ]);
  const trend: TrendPoint[] = baseBuilds.reverse().map((build) => ({
    buildId: build.id,
    createdAt: build.createdAt.toISOString(),
    error: build.errorCount,
    warning: build.warningCount,
    info: build.infoCount
  }));
  const newest = trend.at(-1);
  return {
    slug: project.slug,
    name: project.name,
    baseBranch: project.baseBranch,
    latest: latest ? summarize(latest) : null,
    open: newest
      ? { error: newest.error, warning: newest.warning, info: newest.info }
      : { error: 0, warning: 0, info: 0 },
    trend,
    lastBuildAt: latest ? latest.createdAt.toISOString() : null
  };
}

function summarize(build: Build): LatestBuildSummary {
  return {
    id: build.id,
    verdict: build.verdict,
    label: build.label,
    branch: build.branch,
    commitSha: build.commitSha,
    createdAt: build.createdAt.toISOString()
  };
}

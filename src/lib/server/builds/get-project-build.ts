/**
 * Looks up one build of a project by the id in a URL, so every build route answers an unknown
 * or foreign build the same way.
 */
import { Build } from '../db/models';
import { ApiError } from '../ingest/api-error';

/**
 * The build `buildIdText` of the project.
 * @throws ApiError 404 `build.not-found` when the id is not a build of this project (or not a number).
 */
export async function getProjectBuild(projectId: number, buildIdText: string): Promise<Build> {
  const buildId = parseId(buildIdText);
  const build = buildId === null ? null : await Build.findOne({ where: { id: buildId, projectId } });
  if (!build) {
    throw new ApiError(404, 'build.not-found', `This project has no build "${buildIdText}". Check the build id.`);
  }
  return build;
}

/** A positive integer id from URL text, or null. */
export function parseId(text: string): number | null {
  if (!/^[1-9]\d{0,15}$/.test(text)) return null;
  const id = Number(text);
  return Number.isSafeInteger(id) ? id : null;
}

/**
 * GET a build's lint report as a download: `report.json` (Orientry's JSON report),
 * `report.sarif` (SARIF 2.1.0) or `report.junit` (JUnit XML). Signed-in project members may read
 * it, and so may CI with the project's API token (`Authorization: Bearer …`, scope `submit`),
 * limited to that project's builds: `orientry submit --format sarif` downloads it this way.
 */
import { exportBuildReport, isReportFormat, REPORT_FORMATS } from '$lib/server/builds/export-build-report';
import { getProjectBuild } from '$lib/server/builds/get-project-build';
import { ApiError } from '$lib/server/ingest/api-error';
import { apiHandler } from '$lib/server/ingest/api-handler';
import { requireMemberOrToken } from '$lib/server/ingest/require-member-or-token';
import type { RequestHandler } from './$types';

/** The build's report file in the named format. */
export const GET: RequestHandler = apiHandler(async (event) => {
  const { format } = event.params;
  if (!isReportFormat(format)) {
    throw new ApiError(
      404,
      'report.format-unknown',
      `There is no "${format}" report. Use report.${Object.keys(REPORT_FORMATS).join(', report.')}.`
    );
  }
  const { project } = await requireMemberOrToken(event, event.params.project, {
    minimumRole: 'viewer',
    scope: 'submit'
  });
  const build = await getProjectBuild(project.id, event.params.id);
  const file = await exportBuildReport(build, project.slug, format, event.url.origin);
  return new Response(file.body, {
    headers: {
      'content-type': file.contentType,
      'content-disposition': `attachment; filename="${file.fileName}"`,
      'cache-control': 'private, no-store'
    }
  });
});

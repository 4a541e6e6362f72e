import { requireProjectRole } from '$lib/server/auth/require-project-role';
import { getProjectBuild } from '$lib/server/builds/get-project-build';
import { findBuildPolicy } from '$lib/server/dashboard/find-build-policy';
import { getAssetOutline } from '$lib/server/dashboard/get-asset-outline';
import { rethrowAsPageError } from '$lib/server/dashboard/rethrow-as-page-error';
import { isProjectRoleAtLeast } from '$lib/types/roles';
import type { PageServerLoad } from './$types';

/**
 * One asset of a build: its animated nodes and rotation channels, its findings and the policy
 * the build used. The channel on screen comes from `?channel=animation:channel`, else from
 * `?finding=id`, else the channel with the heaviest finding; the browser then reads the keys
 * of every channel from the channels API to plot them.
 */
export const load: PageServerLoad = async ({ locals, params, url }) => {
  const { project, role } = await requireProjectRole(locals, params.project, 'viewer');
  const build = await getProjectBuild(project.id, params.id).catch(rethrowAsPageError);
  const [outline, buildPolicy] = await Promise.all([
    getAssetOutline(build.id, params.assetId).catch(rethrowAsPageError),
    findBuildPolicy(build)
  ]);
  const findingParam = Number(url.searchParams.get('finding'));
  const requestedFinding = outline.findings.find((finding) => finding.id === findingParam) ?? null;
  const requestedChannel = outline.channels.find((channel) => channel.id === url.searchParams.get('channel')) ?? null;
  const worstChannel =
    outline.findings.map((finding) => finding.channelId).find((channelId) => channelId !== null) ?? null;
  const selectedChannelId =
    requestedChannel?.id ?? requestedFinding?.channelId ?? worstChannel ?? outline.channels[0]?.id ?? null;
  return {
    build: { id: build.id, label: build.label, branch: build.branch, verdict: build.verdict },
    outline,
    policy: buildPolicy.policy,
    isPolicyExact: buildPolicy.isExact,
    selectedChannelId,
    selectedFindingId: requestedFinding?.id ?? null,
    canDownloadFixed: isProjectRoleAtLeast(role, 'artist')
  };
};

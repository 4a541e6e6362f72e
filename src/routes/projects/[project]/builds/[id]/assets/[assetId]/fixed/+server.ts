/**
 * GET the asset with the automatic fixes the build's policy calls for, as a GLB attachment, for
 * artists, leads and admins of the project (viewers get 403: they read, they do not change files).
 */
import { Asset } from '$lib/server/db/models';
import { requireProjectRole } from '$lib/server/auth/require-project-role';
import { getProjectBuild, parseId } from '$lib/server/builds/get-project-build';
import { findBuildPolicy } from '$lib/server/dashboard/find-build-policy';
import { rethrowAsPageError } from '$lib/server/dashboard/rethrow-as-page-error';
import { writeFixedAsset } from '$lib/server/dashboard/write-fixed-asset';
import { error } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async ({ locals, params }) => {
  const { project } = await requireProjectRole(locals, params.project, 'artist');
  const build = await getProjectBuild(project.id, params.id).catch(rethrowAsPageError);
  const assetId = parseId(params.assetId);
  const asset = assetId === null ? null : await Asset.findOne({ where: { id: assetId, buildId: build.id } });
  if (!asset) {
    error(404, {
      message: `This build has no asset "${params.assetId}". Check the asset id.`,
      code: 'asset.not-found'
    });
  }
  const { policy } = await findBuildPolicy(build);
  const file = await writeFixedAsset(asset, policy).catch(rethrowAsPageError);
  return new Response(Buffer.from(file.bytes), {
    headers: {
      'content-type': 'model/gltf-binary',
      'content-disposition': `attachment; filename="${file.fileName.replace(/["\\\r\n]/g, '_')}"`,
      'cache-control': 'private, no-store',
      'x-orientry-fixes': file.applied.join(', ') || 'none'
    }
  });
};

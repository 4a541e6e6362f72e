/**
 * Reads a stored asset back from its blobs into a glTF-Transform Document: the main file by its
 * hash, side files through the paths it read when it was linted. Nothing but blobs is opened.
 */
import type { Document } from '@gltf-transform/core';
import { readAssetDocument } from '../../lint/read/read-asset-document';
import { getConfig } from '../config';
import type { Asset } from '../db/models';
import { ApiError } from '../ingest/api-error';
import { assetSideFiles } from '../ingest/asset-side-file';
import { readBlob } from '../ingest/blob-store';

/**
 * The Document of a stored asset.
 * @throws ApiError 410 `asset.blob-missing` when the stored file is gone from the data folder;
 *   the lint library's AssetReadError when the file cannot be read (an unreadable asset).
 */
export async function readStoredAsset(asset: Asset): Promise<Document> {
  const { dataDir } = getConfig();
  const bytes = await readBlob(dataDir, asset.contentHash);
  if (!bytes) {
    throw new ApiError(
      410,
      'asset.blob-missing',
      `The stored file of ${asset.path} is no longer in the data folder, so its channels cannot be read.`
    );
  }
  const sideFiles = await assetSideFiles().findAll({ where: { assetId: asset.id } });
  const digests = new Map(sideFiles.map((row) => [row.path, row.contentHash]));
  return readAssetDocument({
    path: asset.path,
    bytes,
    async readSideFile(relativePath) {
      const digest = digests.get(relativePath);
      return digest ? readBlob(dataDir, digest) : null;
    }
  });
}

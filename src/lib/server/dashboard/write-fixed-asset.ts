/**
 * A stored asset with the automatic fixes applied, as a GLB file to download: what `orientry fix`
 * would write for the same file and policy, built from the blobs the build stored.
 */
import { Logger, NodeIO, type Document } from '@gltf-transform/core';
import { ALL_EXTENSIONS } from '@gltf-transform/extensions';
import { isAssetReadError } from '../../lint/asset-read-error';
import { fixDocument } from '../../lint/fix/index';
import type { Policy } from '../../lint/policy';
import { readAssetDocument, type ReadOptions } from '../../lint/read/read-asset-document';
import { getConfig } from '../config';
import type { Asset } from '../db/models';
import { ApiError } from '../ingest/api-error';
import { assetSideFiles } from '../ingest/asset-side-file';
import { readBlob } from '../ingest/blob-store';

/** A fixed asset ready to send. */
export interface FixedAssetFile {
  fileName: string;
  bytes: Uint8Array;
  /** Names of the fixes that changed something (empty: the file had nothing to fix). */
  applied: string[];
}

const COMPRESSION_EXTENSIONS = ['KHR_draco_mesh_compression', 'EXT_meshopt_compression'];
const DRACO_EXTENSION = '"KHR_draco_mesh_compression"';

/**
 * Reads `asset` from its blobs (images included, so the file written back keeps its textures),
 * applies `fixDocument` under `policy` and writes one GLB. Draco and meshopt geometry is written
 * decoded, as the CLI does: compressing again with default settings would quantize it twice.
 * @throws ApiError 410 `asset.blob-missing` when a stored file is gone; 409 `asset.not-fixable`
 *   when the file cannot be read back whole (unreadable, or a side file the build never sent).
 */
export async function writeFixedAsset(asset: Asset, policy: Policy): Promise<FixedAssetFile> {
  const document = await readWholeAsset(asset);
  const { applied } = await fixDocument(document, policy);
  for (const extension of document.getRoot().listExtensionsUsed()) {
    if (COMPRESSION_EXTENSIONS.includes(extension.extensionName)) extension.dispose();
  }
  mergeBuffers(document);
  // The writer drops every extension it was not given, so it gets all it knows (materials, texture transforms...).
  const io = new NodeIO().setLogger(new Logger(Logger.Verbosity.WARN)).registerExtensions(ALL_EXTENSIONS);
  return { fileName: fixedFileName(asset.path), bytes: await io.writeBinary(document), applied };
}

/** `chars/hero.gltf` → `hero.fixed.glb`. */
export function fixedFileName(assetPath: string): string {
  const base = assetPath.split('/').at(-1) ?? 'asset';
  return `${base.replace(/\.(glb|gltf)$/i, '')}.fixed.glb`;
}

async function readWholeAsset(asset: Asset): Promise<Document> {
  const { dataDir } = getConfig();
  const bytes = await readBlob(dataDir, asset.contentHash);
  if (!bytes) {
    throw new ApiError(
      410,
      'asset.blob-missing',
      `The stored file of ${asset.path} is no longer in the data folder, so no fixed copy can be made.`
    );
  }
  const sideFiles = await assetSideFiles().findAll({ where: { assetId: asset.id } });
  const digests = new Map(sideFiles.map((row) => [row.path, row.contentHash]));
  const options: ReadOptions = { includeImages: true, ...(await dracoOptions(bytes)) };
  try {
    return await readAssetDocument(
      {
        path: asset.path,
        bytes,
        async readSideFile(relativePath) {
          const digest = digests.get(relativePath);
          return digest ? readBlob(dataDir, digest) : null;
        }
      },
      options
    );
  } catch (caught) {
    if (!isAssetReadError(caught)) throw caught;
    throw new ApiError(
      409,
      'asset.not-fixable',
      `${asset.path} cannot be read back whole, so no fixed copy can be made: ${caught.message} ` +
        'Run `orientry fix` on the original file instead.',
      { cause: caught }
    );
  }
}

/** The Draco decoder, loaded only for files that name the extension (starting it costs time and memory). */
async function dracoOptions(bytes: Uint8Array): Promise<Pick<ReadOptions, 'dracoDecoder'>> {
  const head = new TextDecoder().decode(bytes.subarray(0, Math.min(bytes.byteLength, 1 << 20)));
  if (!head.includes(DRACO_EXTENSION)) return {};
  const draco = (await import('draco3dgltf' as string)) as { default: { createDecoderModule(): Promise<unknown> } };
  return { dracoDecoder: await draco.default.createDecoderModule() };
}

/** GLB holds at most one buffer (glTF 2.0 §4.4.3.1): move every accessor into the first. */
function mergeBuffers(document: Document): void {
  const root = document.getRoot();
  const buffers = root.listBuffers();
  const target = buffers[0] ?? (root.listAccessors().length > 0 ? document.createBuffer() : null);
  if (!target) return;
  for (const accessor of root.listAccessors()) accessor.setBuffer(target);
  for (const buffer of buffers.slice(1)) buffer.dispose();
  target.setURI('');
}

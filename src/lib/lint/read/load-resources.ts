/**
 * Gathers the bytes behind every buffer (and, on request, image) of a glTF JSON: the GLB BIN
 * chunk, decoded `data:` URIs, and side files through the caller's `readSideFile`. Every URI is
 * resolved and checked before the first side file is requested, so a file that points outside
 * its folder is refused without any read at all.
 */
import { AssetReadError, isAssetReadError } from '../asset-read-error';
import type { AssetSource } from '../asset-source';
import { decodeDataUri } from './decode-data-uri';
import type { GltfJson } from './gltf-json-schema';
import { isDataUri, resolveSideFilePath } from './resolve-uri';
import { shortenForMessage } from './shorten-for-message';

/** The resources map @gltf-transform/core's `readJSON` takes, plus facts the reader needs. */
export interface LoadedResources {
  /** Keyed by the (possibly rewritten) `uri` of each buffer and image; GLB buffer 0 under `@glb.bin`. */
  resources: Record<string, Uint8Array>;
  /** Bytes of each buffer in buffer order; null for a meshopt fallback buffer with no data. */
  bufferBytes: (Uint8Array | null)[];
  /** Total bytes of the side files read. */
  sideFileByteLength: number;
}

/** Key @gltf-transform/core uses for the GLB BIN chunk. */
export const GLB_BUFFER_KEY = '@glb.bin';
const EMPTY = new Uint8Array(0);

/**
 * Loads every resource of `json`, rewriting data URIs in place to short keys.
 * @param includeImages when false, image URIs are still checked but their bytes are not read.
 */
export async function loadResources(
  json: GltfJson,
  binChunk: Uint8Array | null,
  isGlb: boolean,
  source: AssetSource,
  includeImages: boolean
): Promise<LoadedResources> {
  const resources: Record<string, Uint8Array> = {};
  const bufferBytes: (Uint8Array | null)[] = [];
  const sideFiles = new Map<string, { uriKey: string; where: string }[]>();
  const pendingBuffers: { bufferIndex: number; path: string }[] = [];

  (json.buffers ?? []).forEach((buffer, bufferIndex) => {
    const where = `buffers[${bufferIndex}]`;
    const uri = buffer.uri;
    if (uri === undefined) {
      if (isMeshoptFallback(buffer.extensions)) {
        bufferBytes[bufferIndex] = null;
      } else if (isGlb && bufferIndex === 0 && binChunk) {
        resources[GLB_BUFFER_KEY] = binChunk;
        bufferBytes[bufferIndex] = binChunk;
      } else {
        throw new AssetReadError(
          'asset.structure-invalid',
          `${source.path}: ${where} has no uri` + (isGlb ? ' and the GLB has no BIN chunk for it.' : '.'),
          'Export the asset again; the buffer data is missing from the file.'
        );
      }
    } else if (isDataUri(uri)) {
      const key = `__buffer-${bufferIndex}.bin`;
      const bytes = decodeDataUri(uri, source.path, where);
      resources[key] = bytes;
      bufferBytes[bufferIndex] = bytes;
      buffer.uri = key;
    } else {
      const path = resolveSideFilePath(uri, source.path, where);
      addSideFile(sideFiles, path, uri, where);
      pendingBuffers.push({ bufferIndex, path });
    }
  });

  (json.images ?? []).forEach((image, imageIndex) => {
    const where = `images[${imageIndex}]`;
    const uri = image.uri;
    if (uri === undefined || image.bufferView !== undefined) return;
    if (isDataUri(uri)) {
      const key = `__image-${imageIndex}`;
      resources[key] = includeImages ? decodeDataUri(uri, source.path, where) : EMPTY;
      image.uri = key;
      return;
    }
    const path = resolveSideFilePath(uri, source.path, where);
    if (includeImages) addSideFile(sideFiles, path, uri, where);
    // Lint needs no pixels; an empty placeholder keeps the Document complete without reading them.
    else resources[uri] = EMPTY;
  });

  const loaded = new Map<string, Uint8Array>();
  const reads = [...sideFiles.entries()].map(async ([path, references]) => {
    const bytes = await readOneSideFile(source, path, references[0].where);
    loaded.set(path, bytes);
    for (const reference of references) resources[reference.uriKey] = bytes;
  });
  // Wait for every read before reporting, so no read is left running unobserved.
  const results = await Promise.allSettled(reads);
  const failure = results.find((result) => result.status === 'rejected');
  if (failure) throw (failure as PromiseRejectedResult).reason;

  let sideFileByteLength = 0;
  for (const bytes of loaded.values()) sideFileByteLength += bytes.byteLength;
  for (const { bufferIndex, path } of pendingBuffers) bufferBytes[bufferIndex] = loaded.get(path)!;
  return { resources, bufferBytes, sideFileByteLength };
}

function addSideFile(
  sideFiles: Map<string, { uriKey: string; where: string }[]>,
  path: string,
  uri: string,
  where: string
) {
  const references = sideFiles.get(path) ?? [];
  references.push({ uriKey: uri, where });
  sideFiles.set(path, references);
}

async function readOneSideFile(source: AssetSource, path: string, where: string): Promise<Uint8Array> {
  const shown = shortenForMessage(path);
  let bytes: Uint8Array | null;
  try {
    bytes = await source.readSideFile(path);
  } catch (error) {
    if (isAssetReadError(error)) throw error;
    throw new AssetReadError(
      'asset.side-file-unreadable',
      `${source.path}: ${where} names "${shown}", which could not be read.`,
      'Check the side file is present and readable, then run the lint again.',
      { cause: error }
    );
  }
  if (bytes === null) {
    throw new AssetReadError(
      'asset.side-file-missing',
      `${source.path}: ${where} names "${shown}", which was not provided.`,
      `Include "${shown}" next to the asset (relative to its folder), or embed it in a .glb.`
    );
  }
  return bytes;
}

function isMeshoptFallback(extensions: Record<string, unknown> | undefined): boolean {
  const meshopt = extensions?.EXT_meshopt_compression as { fallback?: unknown } | undefined;
  return meshopt?.fallback === true;
}

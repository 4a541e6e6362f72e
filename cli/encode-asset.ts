/**
 * Encodes a fixed document as the files `orientry fix` writes: one `.glb`, or a `.gltf` with its
 * buffers named after it (`hero.gltf` → `hero.bin`) and its images beside it. Nothing is written
 * here: the caller checks the paths first (never over the input) and then writes them.
 */
import { basename, dirname, extname, join } from 'node:path';
import { ImageUtils, Logger, NodeIO, type Document } from '@gltf-transform/core';
import { ALL_EXTENSIONS } from '@gltf-transform/extensions';
import { CliError } from './cli-error';
import { ExitCode } from './exit-codes';

/** One file to write: absolute path and content. */
export interface EncodedFile {
  path: string;
  bytes: Uint8Array;
}

/** The files of the encoded asset (main file first) and the compression extensions removed. */
export interface EncodedAsset {
  files: EncodedFile[];
  /**
   * Mesh compression extensions dropped on the way out: re-encoding Draco or meshopt with
   * default settings would quantize the geometry again, so the copy stores it decoded instead.
   */
  removedExtensions: string[];
}

const COMPRESSION_EXTENSIONS = ['KHR_draco_mesh_compression', 'EXT_meshopt_compression'];
/** A relative URI we may write as given: plain path segments below the output folder. */
const SAFE_URI = /^(?![a-z][a-z0-9+.-]*:)(?!\/)(?!.*(^|\/)\.\.?(\/|$))[^\\]+$/i;

/**
 * Encodes `document` for `outputPath`, choosing GLB or glTF JSON by its extension.
 * Mutates the document's buffer and image URIs and drops compression extensions; call it last.
 * @throws CliError `output.unsupported-extension` for anything but .glb or .gltf (exit code 2).
 */
export async function encodeAsset(document: Document, outputPath: string): Promise<EncodedAsset> {
  const extension = extname(outputPath).toLowerCase();
  if (extension !== '.glb' && extension !== '.gltf') {
    throw new CliError(
      'output.unsupported-extension',
      `${outputPath}: the output must end in .glb or .gltf (got "${extension || 'no extension'}")`,
      ExitCode.UsageError
    );
  }
  const removedExtensions = removeCompression(document);
  // The writer drops every extension it was not given, so give it all it knows (materials,
  // texture transforms, quantized attributes...). WARN keeps its info lines off stdout.
  const io = new NodeIO().setLogger(new Logger(Logger.Verbosity.WARN)).registerExtensions(ALL_EXTENSIONS);
  if (extension === '.glb') {
    mergeBuffers(document);
    return { files: [{ path: outputPath, bytes: await io.writeBinary(document) }], removedExtensions };
  }
  const name = basename(outputPath, extname(outputPath));
  nameSideFiles(document, name);
  const { json, resources } = await io.writeJSON(document, { basename: name });
  const files: EncodedFile[] = [{ path: outputPath, bytes: new TextEncoder().encode(JSON.stringify(json, null, 2)) }];
  for (const [uri, bytes] of Object.entries(resources)) {
    // Every URI was set or checked above; this guards the write against a future change there.
    if (!SAFE_URI.test(uri)) throw new Error(`refusing to write side file "${uri}" outside the output folder`);
    files.push({ path: join(dirname(outputPath), decodeUri(uri)), bytes });
  }
  return { files, removedExtensions };
}

/** URIs are percent-encoded (glTF 2.0 §3.3.2); a stray `%` means the name was stored raw. */
function decodeUri(uri: string): string {
  try {
    return decodeURIComponent(uri);
  } catch (error) {
    if (error instanceof URIError) return uri;
    throw error;
  }
}

function removeCompression(document: Document): string[] {
  const removed: string[] = [];
  for (const extension of document.getRoot().listExtensionsUsed()) {
    if (COMPRESSION_EXTENSIONS.includes(extension.extensionName)) {
      removed.push(extension.extensionName);
      extension.dispose();
    }
  }
  return removed;
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

/**
 * Buffers are named after the output (`hero.bin`, or `hero_1.bin`... when several). Images keep
 * a plain relative URI; embedded or unsafe ones get `hero_image0.png` so two assets fixed into
 * one folder never overwrite each other's textures.
 */
function nameSideFiles(document: Document, name: string): void {
  const root = document.getRoot();
  for (const buffer of root.listBuffers()) buffer.setURI('');
  root.listTextures().forEach((texture, index) => {
    if (SAFE_URI.test(texture.getURI())) return;
    const extension = ImageUtils.mimeTypeToExtension(texture.getMimeType()) || 'bin';
    texture.setURI(`${name}_image${index}.${extension}`);
  });
}

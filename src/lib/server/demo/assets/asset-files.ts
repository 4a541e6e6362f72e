/**
 * Turns generated documents into the files a build submits: a `.glb`, or a `.gltf` with its
 * `.bin` side file so the ingestion path for external buffers is exercised too.
 */
import { Format, WebIO, type Document } from '@gltf-transform/core';

/** One file of a build, by path relative to the build root (forward slashes). */
export interface DemoFile {
  path: string;
  bytes: Uint8Array;
}

/** Writes a document as GLB bytes. WebIO needs no file system, and writes the same bytes on every platform. */
export async function toGlb(document: Document): Promise<Uint8Array> {
  return await new WebIO().writeBinary(document);
}

/**
 * Writes a document as a `.gltf` at `path` plus one `.bin` beside it, named after the `.gltf`
 * (`chars/kelp-diver.gltf` → `chars/kelp-diver.bin`, referenced by the relative URI `kelp-diver.bin`).
 * Sets the document's buffer URI to that name, the one change it makes to `document`.
 */
export async function toGltfFiles(document: Document, path: string): Promise<DemoFile[]> {
  if (!path.endsWith('.gltf')) throw new TypeError(`toGltfFiles: expected a path ending in .gltf, got "${path}".`);
  const folder = path.includes('/') ? path.slice(0, path.lastIndexOf('/') + 1) : '';
  const basename = path.slice(folder.length, -'.gltf'.length);
  const buffers = document.getRoot().listBuffers();
  if (buffers.length !== 1) {
    throw new TypeError(`toGltfFiles: "${path}" has ${buffers.length} buffers; demo assets keep exactly one.`);
  }
  buffers[0].setURI(`${basename}.bin`);
  const { json, resources } = await new WebIO().writeJSON(document, { format: Format.GLTF, basename });
  const files: DemoFile[] = [{ path, bytes: new TextEncoder().encode(JSON.stringify(json, null, 2)) }];
  for (const [uri, bytes] of Object.entries(resources)) files.push({ path: folder + uri, bytes });
  return files;
}

/** Writes a document as the files for `path`: GLB for `.glb`, `.gltf` + `.bin` for `.gltf`. */
export async function toDemoFiles(document: Document, path: string): Promise<DemoFile[]> {
  if (path.endsWith('.glb')) return [{ path, bytes: await toGlb(document) }];
  return await toGltfFiles(document, path);
}

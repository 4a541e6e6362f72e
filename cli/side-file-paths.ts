/**
 * The side files a glTF asset names: `buffers[].uri` and `images[].uri` that are relative
 * references (glTF 2.0 §3.6.1.1, §3.6.2.2, RFC 3986), read from a .gltf file's JSON or a .glb
 * file's JSON chunk, turned into paths relative to the asset's folder. `submit` uploads these
 * beside the asset so the server finds them where the asset says.
 *
 * The lint library applies the same rules when it reads an asset; a reference it would refuse
 * (an absolute URI, a path climbing out of the folder) is refused here too and never uploaded.
 */
import { open, readFile } from 'node:fs/promises';

/** A side file named by the asset. */
export interface SideFileReference {
  /** Where the asset names it, for messages: `buffers[0]`, `images[2]`. */
  where: string;
  uri: string;
  /** Relative to the asset's folder, forward slashes, no `.` or `..`; null when refused. */
  path: string | null;
  /** Why the reference was refused; null when it was not. */
  refusal: string | null;
}

/** GLB header magic "glTF" and JSON chunk type "JSON", little-endian (glTF 2.0 §4.4.2, §4.4.3.2). */
const GLB_MAGIC = 0x46546c67;
const GLB_JSON_CHUNK = 0x4e4f534a;
/** Larger JSON chunks are not read for side files; the server still lints the asset. */
const MAX_JSON_BYTES = 64 * 1024 * 1024;

/**
 * Reads the asset at `absolutePath` and lists the side files it references. An asset whose JSON
 * cannot be read yields none: it is uploaded as it is, and the server reports it unreadable.
 * `data:` URIs are embedded bytes, not files, and are left out.
 */
export async function listSideFileReferences(absolutePath: string): Promise<SideFileReference[]> {
  const json = await readAssetJson(absolutePath);
  if (json === null) return [];
  const references: SideFileReference[] = [];
  for (const property of ['buffers', 'images'] as const) {
    const list = json[property];
    if (!Array.isArray(list)) continue;
    for (const [index, item] of list.entries()) {
      const uri = (item as { uri?: unknown } | null)?.uri;
      if (typeof uri !== 'string' || /^data:/i.test(uri)) continue;
      const resolved = sideFilePathOf(uri);
      references.push({ where: `${property}[${index}]`, uri, ...resolved });
    }
  }
  return references;
}

/**
 * A relative URI as a path inside the asset folder, or the reason it is refused.
 * @example sideFilePathOf('textures/sea%20foam.png') → { path: 'textures/sea foam.png', refusal: null }
 * @example sideFilePathOf('../shared/rig.bin') → { path: null, refusal: 'climbs out of the asset folder' }
 */
export function sideFilePathOf(uri: string): { path: string | null; refusal: string | null } {
  const refuse = (refusal: string) => ({ path: null, refusal });
  // A scheme (RFC 3986 §3.1) makes it absolute: file:, http:, and a Windows drive letter too.
  if (/^[a-z][a-z0-9+.-]*:/i.test(uri)) return refuse('is an absolute URI');
  if (uri.startsWith('/')) return refuse('is an absolute path');
  if (uri.includes('\\')) return refuse('contains a backslash');
  let decoded: string;
  try {
    // Query and fragment do not name a file (RFC 3986 §3.4, §3.5).
    decoded = decodeURIComponent(uri.replace(/[?#].*$/s, ''));
  } catch {
    // Malformed percent-encoding names no file; the refusal is the whole answer.
    return refuse('has malformed percent-encoding');
  }
  // eslint-disable-next-line no-control-regex -- control characters are what is refused
  if (/[\u0000-\u001f\u007f]/.test(decoded)) return refuse('contains control characters');
  if (decoded.includes('\\') || decoded.startsWith('/') || /^[a-z][a-z0-9+.-]*:/i.test(decoded)) {
    return refuse('decodes to an absolute path or a backslash');
  }
  const segments: string[] = [];
  for (const segment of decoded.split('/')) {
    if (segment === '' || segment === '.') continue;
    if (segment === '..') {
      if (segments.length === 0) return refuse('climbs out of the asset folder');
      segments.pop();
    } else segments.push(segment);
  }
  if (segments.length === 0) return refuse('names the folder itself, not a file');
  return { path: segments.join('/'), refusal: null };
}

/** The glTF JSON of a .gltf or .glb file, or null when it cannot be read as one. */
async function readAssetJson(absolutePath: string): Promise<Record<string, unknown> | null> {
  let text: string | null;
  try {
    text = await readJsonText(absolutePath);
  } catch (error) {
    // An unreadable asset is still uploaded (or refused) by the caller's own read; here it only
    // means there are no side files to add.
    if ((error as { code?: unknown }).code === undefined) throw error;
    return null;
  }
  if (text === null) return null;
  try {
    const json: unknown = JSON.parse(text.replace(/^\uFEFF/, ''));
    return json !== null && typeof json === 'object' && !Array.isArray(json) ? (json as Record<string, unknown>) : null;
  } catch {
    // Not JSON: the server's lint reports the asset as unreadable, with the parser's reason.
    return null;
  }
}

/** The JSON text: the whole .gltf file, or the first chunk of a GLB container. */
async function readJsonText(absolutePath: string): Promise<string | null> {
  const file = await open(absolutePath, 'r');
  try {
    const header = Buffer.alloc(20);
    const { bytesRead } = await file.read(header, 0, 20, 0);
    if (bytesRead >= 4 && header.readUInt32LE(0) === GLB_MAGIC) {
      if (bytesRead < 20 || header.readUInt32LE(16) !== GLB_JSON_CHUNK) return null;
      const chunkLength = header.readUInt32LE(12);
      if (chunkLength > MAX_JSON_BYTES) return null;
      const chunk = Buffer.alloc(chunkLength);
      const read = await file.read(chunk, 0, chunkLength, 20);
      return chunk.subarray(0, read.bytesRead).toString('utf8');
    }
  } finally {
    await file.close();
  }
  return readFile(absolutePath, 'utf8');
}

/**
 * Splits a main file into its glTF JSON and, for GLB, its binary chunk, checking every length
 * against the bytes actually present before touching them (glTF 2.0 §4, "GLB File Format Specification").
 * Detection is by content, not by file extension: a `.gltf` holding GLB bytes reads as GLB.
 */
import { AssetReadError } from '../asset-read-error';

/** The main file, unpacked. `json` is whatever JSON.parse gave: the structure check comes next. */
export interface ParsedContainer {
  json: unknown;
  /** The GLB BIN chunk (a view into the input, no copy), or null for .gltf text or a GLB without one. */
  binChunk: Uint8Array | null;
  isGlb: boolean;
}

// glTF 2.0 §4 (GLB): header magic "glTF", chunk types "JSON" and "BIN\0", all little-endian uint32.
const GLB_MAGIC = 0x46546c67;
const CHUNK_JSON = 0x4e4f534a;
const CHUNK_BIN = 0x004e4942;
const HEADER_BYTE_LENGTH = 12;
const CHUNK_HEADER_BYTE_LENGTH = 8;

/** Unpacks a main file's bytes into JSON and an optional binary chunk. */
export function parseContainer(bytes: Uint8Array, path: string): ParsedContainer {
  if (bytes.byteLength === 0) {
    throw new AssetReadError('asset.empty', `${path}: the file is empty (0 bytes).`, 'Export the asset again.');
  }
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  if (bytes.byteLength >= 4 && view.getUint32(0, true) === GLB_MAGIC) return parseGlb(bytes, view, path);
  return { json: parseJsonText(bytes, path, 0, bytes.byteLength), binChunk: null, isGlb: false };
}

function parseGlb(bytes: Uint8Array, view: DataView, path: string): ParsedContainer {
  const hint = 'The GLB is damaged or truncated: export it again, or check the upload transferred every byte.';
  if (bytes.byteLength < HEADER_BYTE_LENGTH + CHUNK_HEADER_BYTE_LENGTH) {
    throw new AssetReadError(
      'asset.glb-invalid',
      `${path}: GLB is ${bytes.byteLength} bytes, shorter than its 20-byte header.`,
      hint
    );
  }
  const version = view.getUint32(4, true);
  if (version !== 2) {
    throw new AssetReadError(
      'asset.unsupported-version',
      `${path}: GLB container version ${version}; only glTF 2.0 (GLB version 2) is supported.`,
      'Convert the asset to glTF 2.0.'
    );
  }
  const declaredByteLength = view.getUint32(8, true);
  if (declaredByteLength > bytes.byteLength) {
    throw new AssetReadError(
      'asset.glb-invalid',
      `${path}: GLB header declares ${declaredByteLength} bytes but the file has ${bytes.byteLength}.`,
      hint
    );
  }
  const end = Math.max(declaredByteLength, HEADER_BYTE_LENGTH + CHUNK_HEADER_BYTE_LENGTH);
  const jsonByteLength = view.getUint32(12, true);
  const jsonType = view.getUint32(16, true);
  if (jsonType !== CHUNK_JSON) {
    throw new AssetReadError(
      'asset.glb-invalid',
      `${path}: the first GLB chunk has type 0x${jsonType.toString(16)}, expected the JSON chunk.`,
      hint
    );
  }
  const jsonStart = HEADER_BYTE_LENGTH + CHUNK_HEADER_BYTE_LENGTH;
  if (jsonByteLength > end - jsonStart) {
    throw new AssetReadError(
      'asset.glb-invalid',
      `${path}: the JSON chunk claims ${jsonByteLength} bytes but only ${end - jsonStart} follow its header.`,
      hint
    );
  }
  // glTF 2.0 §4, "Structured JSON Content": padding is spaces; some exporters pad with NUL, which JSON.parse rejects.
  let jsonEnd = jsonStart + jsonByteLength;
  while (jsonEnd > jsonStart && bytes[jsonEnd - 1] === 0) jsonEnd--;
  const json = parseJsonText(bytes, path, jsonStart, jsonEnd);

  // glTF 2.0 §4, "Chunks": after JSON, the first BIN chunk holds buffer 0; unknown chunks are skipped.
  let offset = jsonStart + jsonByteLength;
  while (offset + CHUNK_HEADER_BYTE_LENGTH <= end) {
    const chunkByteLength = view.getUint32(offset, true);
    const chunkType = view.getUint32(offset + 4, true);
    const dataStart = offset + CHUNK_HEADER_BYTE_LENGTH;
    if (chunkByteLength > end - dataStart) {
      throw new AssetReadError(
        'asset.glb-invalid',
        `${path}: a GLB chunk at byte ${offset} claims ${chunkByteLength} bytes but only ${end - dataStart} remain.`,
        hint
      );
    }
    if (chunkType === CHUNK_BIN) {
      return { json, binChunk: bytes.subarray(dataStart, dataStart + chunkByteLength), isGlb: true };
    }
    offset = dataStart + chunkByteLength;
  }
  return { json, binChunk: null, isGlb: true };
}

function parseJsonText(bytes: Uint8Array, path: string, start: number, end: number): unknown {
  // Judge by the first byte before decoding, so binary garbage is "not glTF", not "bad UTF-8".
  if (bytes[firstContentByte(bytes, start, end)] !== 0x7b) {
    throw new AssetReadError(
      'asset.not-gltf',
      `${path}: not a glTF asset: no GLB header and the content does not start with a JSON object.`,
      'Upload .glb or .gltf files only; check the file was not replaced by another format.'
    );
  }
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true, ignoreBOM: false }).decode(bytes.subarray(start, end));
  } catch (error) {
    throw new AssetReadError(
      'asset.json-invalid',
      `${path}: the glTF JSON is not valid UTF-8.`,
      'Save the file as UTF-8 without a byte order mark, as glTF 2.0 requires.',
      { cause: error }
    );
  }
  try {
    return JSON.parse(text);
  } catch (error) {
    throw new AssetReadError(
      'asset.json-invalid',
      `${path}: the glTF JSON does not parse (${(error as Error).message}).`,
      'Export the asset again; a hand edit may have broken the JSON.',
      { cause: error }
    );
  }
}

/** Index of the first byte after a UTF-8 byte order mark and JSON whitespace (RFC 8259 §2). */
function firstContentByte(bytes: Uint8Array, start: number, end: number): number {
  let index = start;
  if (bytes[index] === 0xef && bytes[index + 1] === 0xbb && bytes[index + 2] === 0xbf) index += 3;
  while (
    index < end &&
    (bytes[index] === 0x20 || bytes[index] === 0x09 || bytes[index] === 0x0a || bytes[index] === 0x0d)
  ) {
    index++;
  }
  return index;
}

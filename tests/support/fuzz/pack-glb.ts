/**
 * Packs JSON bytes and an optional binary chunk into a GLB container exactly as glTF 2.0 §4
 * ("GLB File Format Specification") lays it out: 12-byte header, then chunks of
 * (uint32 length, uint32 type, data) padded to 4 bytes (JSON with spaces, BIN with zeros).
 * The fuzz generators use it to wrap damaged JSON in an otherwise well-formed container.
 */

const GLB_MAGIC = 0x46546c67; // "glTF"
const CHUNK_JSON = 0x4e4f534a; // "JSON"
const CHUNK_BIN = 0x004e4942; // "BIN\0"

/** A GLB of `jsonBytes` (taken as is, even when not valid UTF-8 or JSON) and `bin`. */
export function packGlb(jsonBytes: Uint8Array, bin: Uint8Array | null = null): Uint8Array {
  const jsonByteLength = padded(jsonBytes.byteLength);
  const binByteLength = bin ? padded(bin.byteLength) : 0;
  const total = 12 + 8 + jsonByteLength + (bin ? 8 + binByteLength : 0);
  const bytes = new Uint8Array(total);
  const view = new DataView(bytes.buffer);
  view.setUint32(0, GLB_MAGIC, true);
  view.setUint32(4, 2, true);
  view.setUint32(8, total, true);
  view.setUint32(12, jsonByteLength, true);
  view.setUint32(16, CHUNK_JSON, true);
  bytes.set(jsonBytes, 20);
  bytes.fill(0x20, 20 + jsonBytes.byteLength, 20 + jsonByteLength);
  if (bin) {
    const binStart = 20 + jsonByteLength;
    view.setUint32(binStart, binByteLength, true);
    view.setUint32(binStart + 4, CHUNK_BIN, true);
    bytes.set(bin, binStart + 8);
  }
  return bytes;
}

/** Byte offsets of a GLB's header fields and chunks, read from the bytes (no checks: inputs are our own seeds). */
export interface GlbLayout {
  jsonChunkStart: number;
  jsonByteLength: number;
  /** Offset of the BIN chunk header, or -1 when there is none. */
  binChunkStart: number;
}

/** Where the chunks of a well-formed GLB lie. */
export function glbLayoutOf(glb: Uint8Array): GlbLayout {
  const view = new DataView(glb.buffer, glb.byteOffset, glb.byteLength);
  const jsonByteLength = view.getUint32(12, true);
  const binChunkStart = 20 + jsonByteLength;
  return {
    jsonChunkStart: 12,
    jsonByteLength,
    binChunkStart: binChunkStart + 8 <= glb.byteLength ? binChunkStart : -1
  };
}

function padded(byteLength: number): number {
  return Math.ceil(byteLength / 4) * 4;
}

/**
 * The Draco mesh decoder, created only when an asset needs it: KHR_draco_mesh_compression
 * meshes cannot be read without it, and starting the WebAssembly module costs time and memory
 * that most rotation-only assets never need. The lint library takes it as `options.dracoDecoder`.
 */
import { loadDracoDecoderWasm } from './draco-wasm';

const DRACO_EXTENSION = '"KHR_draco_mesh_compression"';
// glTF 2.0 §4.4: GLB magic "glTF", then the JSON chunk's length at byte 12 and its data at byte 20.
const GLB_MAGIC = 0x46546c67;
const GLB_JSON_START = 20;

let decoder: Promise<unknown> | null = null;

/**
 * True when the main file's JSON names KHR_draco_mesh_compression (in extensionsUsed or on a
 * primitive). A cheap text search: the JSON is parsed properly later, by the library.
 */
export function usesDraco(bytes: Uint8Array): boolean {
  let json = bytes;
  if (bytes.byteLength >= GLB_JSON_START) {
    const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    if (view.getUint32(0, true) === GLB_MAGIC) {
      const end = Math.min(bytes.byteLength, GLB_JSON_START + view.getUint32(12, true));
      json = bytes.subarray(GLB_JSON_START, end);
    }
  }
  return new TextDecoder().decode(json).includes(DRACO_EXTENSION);
}

/** The shared decoder module, created on first use. */
export function getDracoDecoder(): Promise<unknown> {
  decoder ??= createDecoder();
  return decoder;
}

/** Read options for the lint library: the decoder only when these bytes need it. */
export async function getReadOptions(bytes: Uint8Array): Promise<{ dracoDecoder?: unknown }> {
  return usesDraco(bytes) ? { dracoDecoder: await getDracoDecoder() } : {};
}

async function createDecoder(): Promise<unknown> {
  // `default` is module.exports for this CommonJS package under node and under the bundler alike.
  const [{ default: draco }, wasmBinary] = await Promise.all([import('draco3dgltf'), loadDracoDecoderWasm()]);
  return draco.createDecoderModule({ wasmBinary });
}

/**
 * The Draco decoder's WebAssembly bytes, read from the installed `draco3dgltf` package.
 * The bundled CLI cannot find the package's files beside itself, so cli/build.js swaps this
 * module for one that embeds the same bytes in the bundle; keep the export's name and shape.
 */
import { readFile } from 'node:fs/promises';
import { createRequire } from 'node:module';

/** Reads draco_decoder_gltf.wasm from node_modules. */
export async function loadDracoDecoderWasm(): Promise<Uint8Array> {
  const require = createRequire(import.meta.url);
  return new Uint8Array(await readFile(require.resolve('draco3dgltf/draco_decoder_gltf.wasm')));
}

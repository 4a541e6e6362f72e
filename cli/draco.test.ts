import { describe, expect, it } from 'vitest';
import { getDracoDecoder, getReadOptions, usesDraco } from './draco';

const encoder = new TextEncoder();

/** A GLB container around `json` (glTF 2.0 §4.4: 12-byte header, JSON chunk padded to 4 bytes). */
function glbWith(json: string): Uint8Array {
  const jsonBytes = encoder.encode(json.padEnd(Math.ceil(json.length / 4) * 4, ' '));
  const bytes = new Uint8Array(20 + jsonBytes.byteLength);
  const view = new DataView(bytes.buffer);
  view.setUint32(0, 0x46546c67, true);
  view.setUint32(4, 2, true);
  view.setUint32(8, bytes.byteLength, true);
  view.setUint32(12, jsonBytes.byteLength, true);
  view.setUint32(16, 0x4e4f534a, true);
  bytes.set(jsonBytes, 20);
  return bytes;
}

const DRACO_JSON = JSON.stringify({ asset: { version: '2.0' }, extensionsUsed: ['KHR_draco_mesh_compression'] });
const PLAIN_JSON = JSON.stringify({ asset: { version: '2.0' }, extensionsUsed: ['KHR_mesh_quantization'] });

describe('usesDraco', () => {
  it('finds the extension in a .gltf and in a GLB JSON chunk', () => {
    expect(usesDraco(encoder.encode(DRACO_JSON))).toBe(true);
    expect(usesDraco(glbWith(DRACO_JSON))).toBe(true);
  });

  it('is false for assets that do not name it', () => {
    expect(usesDraco(encoder.encode(PLAIN_JSON))).toBe(false);
    expect(usesDraco(glbWith(PLAIN_JSON))).toBe(false);
  });

  it('looks only at the GLB JSON chunk, not at binary data after it', () => {
    const glb = glbWith(PLAIN_JSON);
    const withBin = new Uint8Array(glb.byteLength + 40);
    withBin.set(glb);
    withBin.set(encoder.encode('"KHR_draco_mesh_compression"'), glb.byteLength + 8);
    expect(usesDraco(withBin)).toBe(false);
  });
});

describe('getReadOptions', () => {
  it('creates no decoder for an asset without Draco', async () => {
    expect(await getReadOptions(encoder.encode(PLAIN_JSON))).toEqual({});
  });

  it('creates the decoder once and shares it', async () => {
    const options = await getReadOptions(encoder.encode(DRACO_JSON));
    // The Emscripten module exposes the Draco Decoder class (draco3dgltf README).
    expect(typeof (options.dracoDecoder as { Decoder?: unknown }).Decoder).toBe('function');
    expect(await getDracoDecoder()).toBe(options.dracoDecoder);
  });
});

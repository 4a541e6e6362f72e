/**
 * Keyframes read in place (keyframe-views.ts). The oracle is @gltf-transform/core's own read of
 * the same bytes (its per-accessor copy): every accessor must hold the same values either way,
 * and the lint of every reference asset must come out the same.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import type { Document } from '@gltf-transform/core';
import { describe, expect, it } from 'vitest';
import { lintAsset } from '../lint-asset';
import { lintDocument } from '../lint-document';
import { defaultPolicy } from '../policy';
import { readAsset } from './read-asset-document';
import { buildAnimatedDocument, concatBytes, dataUriOf, jsonBytes, sourceFromBytes, writeGlb } from './testing';

async function readBoth(path: string, bytes: Uint8Array): Promise<{ viewed: Document; copied: Document }> {
  const viewed = (await readAsset(sourceFromBytes(path, bytes), { viewKeyframes: true })).document;
  const copied = (await readAsset(sourceFromBytes(path, bytes))).document;
  return { viewed, copied };
}

/** Every accessor's type, count, componentType, normalized flag and values. */
function accessorsOf(document: Document) {
  return document
    .getRoot()
    .listAccessors()
    .map((accessor) => ({
      type: accessor.getType(),
      count: accessor.getCount(),
      componentType: accessor.getComponentType(),
      normalized: accessor.getNormalized(),
      sparse: accessor.getSparse(),
      values: Array.from(accessor.getArray() ?? [])
    }));
}

function sharesBytes(document: Document, bytes: Uint8Array): boolean[] {
  return document
    .getRoot()
    .listAccessors()
    .map((accessor) => accessor.getArray()?.buffer === bytes.buffer);
}

const turn = [0, 0, 0, 1, 0, 0.3826834, 0, 0.9238795, 0, 0.7071068, 0, 0.7071068];

async function mixedGlb(): Promise<Uint8Array> {
  const cubic = [0, 0, 0, 0, ...turn.slice(0, 4), 0, 0.1, 0, 0, 0, 0.1, 0, 0, ...turn.slice(4, 8), 0, 0, 0, 0];
  return writeGlb(
    buildAnimatedDocument([
      { nodeName: 'Mast', interpolation: 'LINEAR', times: [0, 0.5, 1], output: new Float32Array(turn) },
      { nodeName: 'Boom', interpolation: 'CUBICSPLINE', times: [0, 1], output: new Float32Array(cubic) },
      {
        nodeName: 'Flag',
        interpolation: 'STEP',
        times: [0, 0.5, 1],
        output: new Int16Array(turn.map((value) => Math.round(value * 32767))),
        normalized: true
      }
    ])
  );
}

describe('reading keyframes in place', () => {
  it('views the file bytes for every animation accessor, with the values the copying read gives', async () => {
    const bytes = await mixedGlb();
    const { viewed, copied } = await readBoth('rig.glb', bytes);
    expect(accessorsOf(viewed)).toEqual(accessorsOf(copied));
    expect(sharesBytes(viewed, bytes)).toEqual(Array(6).fill(true));
    expect(sharesBytes(copied, bytes)).toEqual(Array(6).fill(false));
  });

  it('copies instead when the bytes sit at an offset no float can be read at', async () => {
    const glb = await mixedGlb();
    const shifted = new Uint8Array(glb.byteLength + 1).subarray(1);
    shifted.set(glb);
    const { viewed, copied } = await readBoth('rig.glb', shifted);
    expect(accessorsOf(viewed)).toEqual(accessorsOf(copied));
    expect(sharesBytes(viewed, shifted)).toEqual(Array(6).fill(false));
  });

  it('leaves interleaved and sparse outputs to the reader, and still views the plain input', async () => {
    // glTF 2.0 §3.6.2.4 (byteStride) and §3.6.2.3 (sparse accessors); one 4-byte pad per key.
    const times = new Float32Array([0, 1]);
    const strided = new Float32Array([0, 0, 0, 1, 9, 0, 0.6, 0, 0.8, 9]);
    const indices = new Uint16Array([1, 0]);
    const sparseValues = new Float32Array([0.6, 0, 0, 0.8]);
    const buffer = concatBytes(times, strided, indices, sparseValues);
    const json = {
      asset: { version: '2.0' },
      scenes: [{ nodes: [0, 1] }],
      nodes: [{ name: 'Kite' }, { name: 'Tail' }],
      buffers: [{ byteLength: buffer.byteLength, uri: dataUriOf(buffer) }],
      bufferViews: [
        { buffer: 0, byteOffset: 0, byteLength: 8 },
        { buffer: 0, byteOffset: 8, byteLength: 40, byteStride: 20 },
        { buffer: 0, byteOffset: 48, byteLength: 4 },
        { buffer: 0, byteOffset: 52, byteLength: 16 }
      ],
      accessors: [
        { bufferView: 0, componentType: 5126, count: 2, type: 'SCALAR', min: [0], max: [1] },
        { bufferView: 1, componentType: 5126, count: 2, type: 'VEC4' },
        {
          bufferView: 1,
          componentType: 5126,
          count: 2,
          type: 'VEC4',
          sparse: { count: 1, indices: { bufferView: 2, componentType: 5123 }, values: { bufferView: 3 } }
        }
      ],
      animations: [
        {
          samplers: [
            { input: 0, output: 1, interpolation: 'LINEAR' },
            { input: 0, output: 2, interpolation: 'LINEAR' }
          ],
          channels: [
            { sampler: 0, target: { node: 0, path: 'rotation' } },
            { sampler: 1, target: { node: 1, path: 'rotation' } }
          ]
        }
      ]
    };
    const { viewed, copied } = await readBoth('kite.gltf', jsonBytes(json));
    expect(accessorsOf(viewed)).toEqual(accessorsOf(copied));
    expect(accessorsOf(viewed)[1].values).toEqual([0, 0, 0, 1, 0, 0.6, 0, 0.8].map(Math.fround));
    expect(accessorsOf(viewed)[2].values).toEqual([0, 0, 0, 1, 0.6, 0, 0, 0.8].map(Math.fround));
    // The input views the decoded data URI, not the JSON text; the others are the reader's copies.
    const arrays = viewed
      .getRoot()
      .listAccessors()
      .map((accessor) => accessor.getArray()!);
    expect(arrays[0].buffer).not.toBe(arrays[1].buffer);
    expect(arrays[0].byteLength).toBe(8);
  });

  it.each(['AnimatedTriangle.gltf', 'SimpleSkin.gltf', 'RiggedFigure.gltf', 'OrientationTest.gltf'])(
    'lints the reference asset %s to the same findings as the copying read',
    async (fileName) => {
      // Real files from the glTF sample models (tests/fixtures/reference/ATTRIBUTION.md).
      const folder = fileURLToPath(new URL('../../../../tests/fixtures/reference/', import.meta.url));
      const bytes = new Uint8Array(readFileSync(folder + fileName));
      const policy = defaultPolicy();
      const viewed = await lintAsset(sourceFromBytes(fileName, bytes), policy);
      const { document } = await readAsset(sourceFromBytes(fileName, bytes));
      const copied = lintDocument(document, fileName, policy);
      expect(viewed.findings).toEqual(copied.findings);
      expect(viewed.stats).toEqual(copied.stats);
    }
  );
});

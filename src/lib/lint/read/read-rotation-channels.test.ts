import { Document } from '@gltf-transform/core';
import { EXTMeshoptCompression, KHRMeshQuantization } from '@gltf-transform/extensions';
import { MeshoptEncoder } from 'meshoptimizer';
import { describe, expect, it } from 'vitest';
import { readAssetDocument } from './read-asset-document';
import { readRotationChannels } from './read-rotation-channels';
import { buildAnimatedDocument, concatBytes, dataUriOf, jsonBytes, sourceFromBytes, writeGlb } from './testing';

async function readBack(document: Document, extensions: Parameters<typeof writeGlb>[1] = []) {
  const bytes = await writeGlb(document, extensions);
  return readRotationChannels(await readAssetDocument(sourceFromBytes('tidewatch/buoy.glb', bytes)));
}

describe('readRotationChannels: quantized outputs (KHR_mesh_quantization)', () => {
  it('decodes a normalized SHORT rotation output per the §3.11 table and reports its step', async () => {
    const document = buildAnimatedDocument([
      {
        nodeName: 'Buoy',
        interpolation: 'LINEAR',
        times: [0, 0.5],
        output: new Int16Array([0, 0, 16384, 32767, -32768, 0, 0, 32767]),
        normalized: true
      }
    ]);
    document.createExtension(KHRMeshQuantization).setRequired(true);
    const [channel] = await readBack(document, [KHRMeshQuantization]);
    // glTF 2.0 §3.11 table: SHORT max(c/32767, -1), rounded once to float32.
    expect(Array.from(channel.values)).toEqual([0, 0, 16384 / 32767, 1, -1, 0, 0, 1].map(Math.fround));
    expect(channel.quantizationStep).toBe(1 / 32767);
    expect(channel.raw).toMatchObject({ componentType: 5122, normalized: true, outputType: 'VEC4' });
    expect(channel.keyCount).toBe(2);
  });

  it('decodes a normalized BYTE rotation output per the §3.11 table and reports its step', async () => {
    const document = buildAnimatedDocument([
      {
        nodeName: 'Buoy',
        interpolation: 'STEP',
        times: [0, 1],
        output: new Int8Array([-128, 0, 0, 127, 64, -64, 0, 90]),
        normalized: true
      }
    ]);
    document.createExtension(KHRMeshQuantization).setRequired(true);
    const [channel] = await readBack(document, [KHRMeshQuantization]);
    // glTF 2.0 §3.11 table: BYTE max(c/127, -1).
    expect(Array.from(channel.values)).toEqual([-1, 0, 0, 1, 64 / 127, -64 / 127, 0, 90 / 127].map(Math.fround));
    expect(channel.quantizationStep).toBe(1 / 127);
    expect(channel.raw.componentType).toBe(5120);
  });

  it('still decodes an UNSIGNED_BYTE output (outside the spec for rotation) so rotation-encoding can report it', async () => {
    const document = buildAnimatedDocument([
      {
        nodeName: 'Buoy',
        interpolation: 'LINEAR',
        times: [0],
        output: new Uint8Array([0, 128, 255, 51]),
        normalized: true
      }
    ]);
    const [channel] = await readBack(document);
    // glTF 2.0 §3.11 table: UNSIGNED_BYTE c/255.
    expect(Array.from(channel.values)).toEqual([0, 128 / 255, 1, 51 / 255].map(Math.fround));
    expect(channel.raw).toMatchObject({ componentType: 5121, normalized: true });
    expect(channel.quantizationStep).toBe(1 / 255);
  });
});

describe('readRotationChannels: CUBICSPLINE', () => {
  it('splits in-tangent, value and out-tangent per key as glTF 2.0 Appendix C lays them out', async () => {
    // Hand-built layout: key k holds a_k (in), v_k (value), b_k (out); each float encodes its role.
    const output = new Float32Array(3 * 3 * 4);
    for (let keyIndex = 0; keyIndex < 3; keyIndex++) {
      for (let component = 0; component < 4; component++) {
        output[keyIndex * 12 + component] = 100 + keyIndex * 10 + component; // in-tangent
        output[keyIndex * 12 + 4 + component] = 200 + keyIndex * 10 + component; // value
        output[keyIndex * 12 + 8 + component] = 300 + keyIndex * 10 + component; // out-tangent
      }
    }
    const [channel] = await readBack(
      buildAnimatedDocument([{ nodeName: 'Mast', interpolation: 'CUBICSPLINE', times: [0, 1, 2], output }])
    );
    const expectedOf = (base: number) =>
      [0, 1, 2].flatMap((keyIndex) => [0, 1, 2, 3].map((component) => base + keyIndex * 10 + component));
    expect(channel.keyCount).toBe(3);
    expect(Array.from(channel.inTangents!)).toEqual(expectedOf(100));
    expect(Array.from(channel.values)).toEqual(expectedOf(200));
    expect(Array.from(channel.outTangents!)).toEqual(expectedOf(300));
    expect(channel.raw.outputCount).toBe(9);
  });

  it('splits and decodes a normalized SHORT CUBICSPLINE output', async () => {
    const codes = new Int16Array([1, 2, 3, 4, 0, 0, 0, 32767, -5, -6, -7, -32768]);
    const [channel] = await readBack(
      buildAnimatedDocument([
        { nodeName: 'Mast', interpolation: 'CUBICSPLINE', times: [0], output: codes, normalized: true }
      ])
    );
    // glTF 2.0 §3.11 table: SHORT max(c/32767, -1); tangents share the output's encoding.
    expect(Array.from(channel.inTangents!)).toEqual([1, 2, 3, 4].map((c) => Math.fround(c / 32767)));
    expect(Array.from(channel.values)).toEqual([0, 0, 0, 1]);
    expect(Array.from(channel.outTangents!)).toEqual([...[-5, -6, -7].map((c) => Math.fround(c / 32767)), -1]);
  });

  it('counts only whole keys when the output is short: min(inputs, outputs / 3)', async () => {
    const [channel] = await readBack(
      buildAnimatedDocument([
        { nodeName: 'Mast', interpolation: 'CUBICSPLINE', times: [0, 1, 2], output: new Float32Array(7 * 4) }
      ])
    );
    expect(channel.keyCount).toBe(2);
    expect(channel.values).toHaveLength(8);
    expect(channel.raw).toMatchObject({ inputCount: 3, outputCount: 7 });
  });
});

describe('readRotationChannels: layout and identity', () => {
  it('decodes an output shared by many channels once, so aliasing cannot multiply memory', () => {
    const document = buildAnimatedDocument([
      { nodeName: 'Mast', interpolation: 'CUBICSPLINE', times: [0, 1], output: new Float32Array(6 * 4).fill(0.5) }
    ]);
    const animation = document.getRoot().listAnimations()[0];
    const sampler = animation.listSamplers()[0];
    for (let copy = 0; copy < 3; copy++) {
      const node = document.createNode(`Shroud${copy}`);
      animation.addChannel(
        document.createAnimationChannel().setTargetNode(node).setTargetPath('rotation').setSampler(sampler)
      );
    }
    const channels = readRotationChannels(document);
    expect(channels).toHaveLength(4);
    for (const channel of channels) {
      expect(channel.values.buffer).toBe(channels[0].values.buffer);
      expect(channel.outTangents!.buffer).toBe(channels[0].values.buffer);
      expect(channel.keyCount).toBe(2);
    }
  });

  it('hands out the Document’s own float32 arrays for LINEAR keys instead of copying them', () => {
    const document = buildAnimatedDocument([
      { nodeName: 'Buoy', interpolation: 'LINEAR', times: [0, 1], output: new Float32Array([0, 0, 0, 1, 0, 1, 0, 0]) }
    ]);
    const [channel] = readRotationChannels(document);
    const sampler = document.getRoot().listAnimations()[0].listSamplers()[0];
    expect(channel.values).toBe(sampler.getOutput()!.getArray());
    expect(channel.times).toBe(sampler.getInput()!.getArray());
    expect(channel.quantizationStep).toBe(0);
    expect(channel.inTangents).toBeNull();
  });

  it('uses min(inputs, outputs) keys for LINEAR and a view of the values', () => {
    const [channel] = readRotationChannels(
      buildAnimatedDocument([
        { nodeName: 'Buoy', interpolation: 'LINEAR', times: [0, 1, 2, 3], output: new Float32Array(3 * 4) }
      ])
    );
    expect(channel.keyCount).toBe(3);
    expect(channel.times).toHaveLength(4);
  });

  it('reports no usable keys for a VEC3 output, keeping its raw type for rotation-encoding', () => {
    const [channel] = readRotationChannels(
      buildAnimatedDocument([
        { nodeName: 'Buoy', interpolation: 'LINEAR', times: [0, 1], output: new Float32Array(6), outputType: 'VEC3' }
      ])
    );
    expect(channel.keyCount).toBe(0);
    expect(channel.values).toHaveLength(0);
    expect(channel.raw.outputType).toBe('VEC3');
  });

  it('names nodes by their path from the scene root and marks roots, with rest rotations', () => {
    const document = buildAnimatedDocument([
      {
        nodeName: 'Lantern',
        parentName: 'Mast',
        interpolation: 'LINEAR',
        times: [0],
        output: new Float32Array([0, 0, 0, 1]),
        restRotation: [0, 0.6, 0, 0.8]
      },
      { nodeName: '', interpolation: 'STEP', times: [0], output: new Float32Array([0, 0, 0, 1]) }
    ]);
    const channels = readRotationChannels(document);
    expect(channels.map((channel) => channel.nodePath)).toEqual(['/Mast/Lantern', `/#${channels[1].nodeIndex}`]);
    expect(channels.map((channel) => channel.isRoot)).toEqual([false, true]);
    expect(channels[0].restRotation).toEqual([0, 0.6, 0, 0.8]);
    expect(channels[0]).toMatchObject({
      animation: 'Sway',
      animationIndex: 0,
      channelIndex: 0,
      interpolation: 'LINEAR'
    });
    expect(channels[1]).toMatchObject({ channelIndex: 1, interpolation: 'STEP' });
  });

  it('skips channels that target other paths or no node', () => {
    const document = buildAnimatedDocument([
      { nodeName: 'Buoy', interpolation: 'LINEAR', times: [0], output: new Float32Array([0, 0, 0, 1]) }
    ]);
    const animation = document.getRoot().listAnimations()[0];
    const sampler = animation.listSamplers()[0];
    const node = document.getRoot().listNodes()[0];
    animation.addChannel(
      document.createAnimationChannel().setTargetNode(node).setTargetPath('scale').setSampler(sampler)
    );
    animation.addChannel(document.createAnimationChannel().setTargetPath('rotation').setSampler(sampler));
    expect(readRotationChannels(document)).toHaveLength(1);
  });
});

describe('readRotationChannels: sparse accessors', () => {
  it('applies sparse overrides to the base data on read', async () => {
    // Base output: identity at keys 0..2; sparse overrides key 1 with (0, 0, 0.6, 0.8).
    const times = new Float32Array([0, 1, 2]);
    const base = new Float32Array([0, 0, 0, 1, 0, 0, 0, 1, 0, 0, 0, 1]);
    const sparseIndices = new Uint16Array([1, 0]); // one index, padded to 4 bytes
    const sparseValues = new Float32Array([0, 0, 0.6, 0.8]);
    const buffer = concatBytes(times, base, sparseIndices, sparseValues);
    const json = {
      asset: { version: '2.0' },
      scenes: [{ nodes: [0] }],
      nodes: [{ name: 'Buoy' }],
      buffers: [{ byteLength: buffer.byteLength, uri: dataUriOf(buffer) }],
      bufferViews: [
        { buffer: 0, byteOffset: 0, byteLength: 12 },
        { buffer: 0, byteOffset: 12, byteLength: 48 },
        { buffer: 0, byteOffset: 60, byteLength: 4 },
        { buffer: 0, byteOffset: 64, byteLength: 16 }
      ],
      accessors: [
        { bufferView: 0, componentType: 5126, count: 3, type: 'SCALAR', min: [0], max: [2] },
        {
          bufferView: 1,
          componentType: 5126,
          count: 3,
          type: 'VEC4',
          sparse: {
            count: 1,
            indices: { bufferView: 2, componentType: 5123 },
            values: { bufferView: 3 }
          }
        }
      ],
      animations: [
        {
          samplers: [{ input: 0, output: 1, interpolation: 'LINEAR' }],
          channels: [{ sampler: 0, target: { node: 0, path: 'rotation' } }]
        }
      ]
    };
    const document = await readAssetDocument(sourceFromBytes('buoy.gltf', jsonBytes(json)));
    const [channel] = readRotationChannels(document);
    expect(Array.from(channel.values)).toEqual([0, 0, 0, 1, 0, 0, 0.6, 0.8, 0, 0, 0, 1].map(Math.fround));
    expect(channel.animation).toBe('#0');
  });
});

describe('readRotationChannels: EXT_meshopt_compression', () => {
  const keys = [
    [0, 0, 0, 1],
    [0.2588190451, 0, 0, 0.9659258263],
    [0.5, 0.5, 0.5, 0.5],
    [-0.1830127, 0.6830127, 0.1830127, 0.6830127]
  ];

  async function roundTrip(method: 'filter' | 'quantize') {
    await MeshoptEncoder.ready;
    const document = buildAnimatedDocument([
      { nodeName: 'Buoy', interpolation: 'LINEAR', times: [0, 1, 2, 3], output: new Float32Array(keys.flat()) }
    ]);
    document
      .createExtension(EXTMeshoptCompression)
      .setRequired(true)
      .setEncoderOptions({ method: method === 'filter' ? 'filter' : 'quantize' } as never);
    const bytes = await writeGlb(document, [EXTMeshoptCompression], { 'meshopt.encoder': MeshoptEncoder });
    const json = JSON.parse(
      new TextDecoder().decode(bytes.subarray(20, 20 + new DataView(bytes.buffer).getUint32(12, true)))
    );
    expect(json.extensionsRequired).toContain('EXT_meshopt_compression');
    return readRotationChannels(await readAssetDocument(sourceFromBytes('buoy.glb', bytes)))[0];
  }

  it('reads back the same keys exactly when meshopt stores them losslessly', async () => {
    const channel = await roundTrip('quantize');
    expect(Array.from(channel.values)).toEqual(keys.flat().map(Math.fround));
    expect(Array.from(channel.times)).toEqual([0, 1, 2, 3]);
  });

  it('reads back filtered keys (quaternion filter, 16-bit normalized) within one quantization step', async () => {
    const channel = await roundTrip('filter');
    // The quaternion filter stores normalized SHORT components (meshopt's filter, 16 bits).
    expect(channel.raw).toMatchObject({ componentType: 5122, normalized: true });
    expect(channel.quantizationStep).toBe(1 / 32767);
    // Tolerance: one SHORT step (glTF 2.0 §3.11 table, 1/32767). The filter quantizes three components
    // and rebuilds the fourth from unit length (meshoptimizer's quaternion filter); on these keys the
    // largest error measured was 0.72 of a step.
    const tolerance = channel.quantizationStep;
    keys
      .flat()
      .forEach((expected, index) => expect(Math.abs(channel.values[index] - expected)).toBeLessThan(tolerance));
  });
});

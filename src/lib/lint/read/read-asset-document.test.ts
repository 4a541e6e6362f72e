import { Document } from '@gltf-transform/core';
import { KHRDracoMeshCompression } from '@gltf-transform/extensions';
import { describe, expect, it } from 'vitest';
import { AssetReadError, type AssetReadErrorCode } from '../asset-read-error';
import { readAsset, readAssetDocument } from './read-asset-document';
import { readRotationChannels } from './read-rotation-channels';
import {
  buildAnimatedDocument,
  concatBytes,
  dataUriOf,
  jsonBytes,
  sourceFromBytes,
  writeGlb,
  writeGltf,
  type RecordingSource
} from './testing';

const IDENTITY_KEYS = new Float32Array([0, 0, 0, 1, 0, 0.6, 0, 0.8]);

function buoyDocument(): Document {
  return buildAnimatedDocument([{ nodeName: 'Buoy', interpolation: 'LINEAR', times: [0, 1], output: IDENTITY_KEYS }]);
}

async function expectReadError(source: RecordingSource, code: AssetReadErrorCode): Promise<AssetReadError> {
  const error = await readAssetDocument(source).then(
    () => null,
    (reason: unknown) => reason
  );
  expect(error).toBeInstanceOf(AssetReadError);
  expect((error as AssetReadError).code).toBe(code);
  expect((error as AssetReadError).hint.length).toBeGreaterThan(0);
  return error as AssetReadError;
}

/** A minimal .gltf JSON with one rotation channel whose buffer is `uri` (48 bytes expected). */
function gltfWithBufferUri(uri: string, byteLength = 40) {
  return {
    asset: { version: '2.0' },
    nodes: [{ name: 'Buoy' }],
    buffers: [{ uri, byteLength }],
    bufferViews: [{ buffer: 0, byteLength }],
    accessors: [
      { bufferView: 0, componentType: 5126, count: 2, type: 'SCALAR' },
      { bufferView: 0, byteOffset: 8, componentType: 5126, count: 2, type: 'VEC4' }
    ],
    animations: [
      {
        samplers: [{ input: 0, output: 1, interpolation: 'LINEAR' }],
        channels: [{ sampler: 0, target: { node: 0, path: 'rotation' } }]
      }
    ]
  };
}
const BUOY_BIN = concatBytes(new Float32Array([0, 1]), IDENTITY_KEYS);

describe('readAssetDocument: side files and URIs', () => {
  it('reads a .gltf whose buffer is a side .bin through readSideFile', async () => {
    const { bytes, sideFiles } = await writeGltf(buoyDocument(), 'buoy');
    const source = sourceFromBytes('harbor/buoy.gltf', bytes, sideFiles);
    const { document, byteLength } = await readAsset(source);
    expect(source.requested).toEqual(['buoy.bin']);
    expect(byteLength).toBe(bytes.byteLength + sideFiles['buoy.bin'].byteLength);
    expect(Array.from(readRotationChannels(document)[0].values)).toEqual(Array.from(IDENTITY_KEYS));
  });

  it('percent-decodes a relative URI and resolves it inside the folder', async () => {
    const source = sourceFromBytes('harbor/buoy.gltf', jsonBytes(gltfWithBufferUri('clips/../buoy%20sway.bin')), {
      'buoy sway.bin': BUOY_BIN
    });
    await readAssetDocument(source);
    expect(source.requested).toEqual(['buoy sway.bin']);
  });

  it('reads a buffer embedded as a base64 data URI without asking for side files', async () => {
    const source = sourceFromBytes('buoy.gltf', jsonBytes(gltfWithBufferUri(dataUriOf(BUOY_BIN))));
    const [channel] = readRotationChannels(await readAssetDocument(source));
    expect(Array.from(channel.values)).toEqual(Array.from(IDENTITY_KEYS));
    expect(source.requested).toEqual([]);
  });

  it('rejects a malformed data URI with asset.uri-invalid', async () => {
    for (const uri of [
      'data:application/octet-stream;base64,AAA', // length not a multiple of 4
      'data:application/octet-stream;base64,AA*A', // not base64
      'data:application/octet-stream,AAAA', // not base64-encoded
      'data:application/octet-stream;base64' // no data part
    ]) {
      await expectReadError(sourceFromBytes('buoy.gltf', jsonBytes(gltfWithBufferUri(uri, 3))), 'asset.uri-invalid');
    }
  });

  const OUTSIDE = [
    '../buoy.bin',
    'clips/../../buoy.bin',
    '/etc/passwd',
    'file:///etc/passwd',
    'http://lanternfish.example/buoy.bin',
    'C:\\assets\\buoy.bin',
    'C:/assets/buoy.bin',
    '..\\buoy.bin',
    'clips\\..\\..\\buoy.bin',
    '%2e%2e/buoy.bin',
    '%2E%2E%2Fbuoy.bin',
    '%2fetc%2fpasswd',
    'clips/%5c..%5c..%5cbuoy.bin',
    '//lanternfish.example/share/buoy.bin',
    'buoy.bin%00.png',
    'javascript:alert(1)'
  ];
  for (const uri of OUTSIDE) {
    it(`refuses the URI ${JSON.stringify(uri)} and never passes it to readSideFile`, async () => {
      const source = sourceFromBytes('harbor/buoy.gltf', jsonBytes(gltfWithBufferUri(uri)), { 'buoy.bin': BUOY_BIN });
      const error = await expectReadError(source, 'asset.uri-outside-folder');
      expect(error.message).toContain('harbor/buoy.gltf');
      expect(source.requested).toEqual([]);
    });
  }

  it('refuses before reading anything when only a later URI leaves the folder', async () => {
    const json = gltfWithBufferUri('buoy.bin');
    json.buffers.push({ uri: '../secrets.bin', byteLength: 4 });
    const source = sourceFromBytes('buoy.gltf', jsonBytes(json), { 'buoy.bin': BUOY_BIN });
    await expectReadError(source, 'asset.uri-outside-folder');
    expect(source.requested).toEqual([]);
  });

  it('refuses an image URI that leaves the folder even though images are not read', async () => {
    const json = { ...gltfWithBufferUri(dataUriOf(BUOY_BIN)), images: [{ uri: '../../textures/sail.png' }] };
    const source = sourceFromBytes('buoy.gltf', jsonBytes(json));
    await expectReadError(source, 'asset.uri-outside-folder');
    expect(source.requested).toEqual([]);
  });

  it('does not read image side files unless asked to', async () => {
    const json = { ...gltfWithBufferUri(dataUriOf(BUOY_BIN)), images: [{ uri: 'sail.png' }] };
    const png = new Uint8Array([0x89, 0x50, 0x4e, 0x47]);
    const lint = sourceFromBytes('buoy.gltf', jsonBytes(json), { 'sail.png': png });
    await readAssetDocument(lint);
    expect(lint.requested).toEqual([]);
    const fix = sourceFromBytes('buoy.gltf', jsonBytes(json), { 'sail.png': png });
    const document = await readAssetDocument(fix, { includeImages: true });
    expect(fix.requested).toEqual(['sail.png']);
    expect(Array.from(document.getRoot().listTextures()[0].getImage()!)).toEqual(Array.from(png));
  });

  it('reports a side file that was not provided as asset.side-file-missing', async () => {
    const error = await expectReadError(
      sourceFromBytes('harbor/buoy.gltf', jsonBytes(gltfWithBufferUri('buoy.bin'))),
      'asset.side-file-missing'
    );
    expect(error.message).toContain('"buoy.bin"');
  });

  it('wraps a failing readSideFile as asset.side-file-unreadable, keeping the cause', async () => {
    const cause = new Error('EACCES: permission denied');
    const source: RecordingSource = {
      ...sourceFromBytes('buoy.gltf', jsonBytes(gltfWithBufferUri('buoy.bin'))),
      readSideFile: async () => {
        throw cause;
      }
    };
    const error = await expectReadError(source, 'asset.side-file-unreadable');
    expect(error.cause).toBe(cause);
  });
});

describe('readAssetDocument: damaged and hostile files', () => {
  it('reads a GLB held in an unaligned slice of a larger buffer', async () => {
    const glb = await writeGlb(buoyDocument());
    const backing = new Uint8Array(glb.byteLength + 3);
    backing.set(glb, 3);
    const document = await readAssetDocument(sourceFromBytes('buoy.glb', backing.subarray(3)));
    expect(readRotationChannels(document)).toHaveLength(1);
  });

  it('reads a GLB whose JSON chunk is padded with NUL bytes instead of spaces', async () => {
    const glb = await writeGlb(buoyDocument());
    const view = new DataView(glb.buffer, glb.byteOffset);
    const jsonLength = view.getUint32(12, true);
    const jsonText = new TextDecoder().decode(glb.subarray(20, 20 + jsonLength)).trimEnd();
    const json = new TextEncoder().encode(jsonText);
    const paddedLength = Math.ceil((json.byteLength + 1) / 4) * 4; // at least one NUL
    const rest = glb.subarray(20 + jsonLength); // the BIN chunk, header included
    // glTF 2.0 §4 (GLB): 12-byte header, then the JSON chunk (length, type "JSON", data), then the rest.
    const rebuilt = new Uint8Array(20 + paddedLength + rest.byteLength);
    const out = new DataView(rebuilt.buffer);
    out.setUint32(0, 0x46546c67, true);
    out.setUint32(4, 2, true);
    out.setUint32(8, rebuilt.byteLength, true);
    out.setUint32(12, paddedLength, true);
    out.setUint32(16, 0x4e4f534a, true);
    rebuilt.set(json, 20);
    rebuilt.set(rest, 20 + paddedLength);
    expect(rebuilt[20 + paddedLength - 1]).toBe(0);
    const document = await readAssetDocument(sourceFromBytes('buoy.glb', rebuilt));
    expect(readRotationChannels(document)).toHaveLength(1);
  });

  it('rejects an empty file', async () => {
    await expectReadError(sourceFromBytes('buoy.glb', new Uint8Array(0)), 'asset.empty');
  });

  it('rejects a truncated GLB whose header claims more bytes than the file has', async () => {
    const glb = await writeGlb(buoyDocument());
    const error = await expectReadError(
      sourceFromBytes('buoy.glb', glb.subarray(0, glb.byteLength - 10)),
      'asset.glb-invalid'
    );
    expect(error.message).toContain(`declares ${glb.byteLength} bytes`);
  });

  it('rejects a GLB whose chunk length runs past the end, without allocating it', async () => {
    const glb = (await writeGlb(buoyDocument())).slice();
    const view = new DataView(glb.buffer);
    const jsonLength = view.getUint32(12, true);
    view.setUint32(20 + jsonLength, 0xfffffff0, true); // BIN chunk claims ~4 GiB
    await expectReadError(sourceFromBytes('buoy.glb', glb), 'asset.glb-invalid');
    view.setUint32(12, 0xfffffff0, true); // JSON chunk claims ~4 GiB
    await expectReadError(sourceFromBytes('buoy.glb', glb), 'asset.glb-invalid');
  });

  it('rejects bytes that are neither GLB nor JSON', async () => {
    const garbage = new Uint8Array(256).map((_, index) => (index * 37 + 11) % 256);
    await expectReadError(sourceFromBytes('buoy.glb', garbage), 'asset.not-gltf');
  });

  it('rejects JSON that is not glTF', async () => {
    await expectReadError(sourceFromBytes('buoy.gltf', jsonBytes({ tide: 'high' })), 'asset.not-gltf');
  });

  it('rejects broken JSON text', async () => {
    await expectReadError(sourceFromBytes('buoy.gltf', new TextEncoder().encode('{"asset": {')), 'asset.json-invalid');
  });

  it('rejects glTF 1.0', async () => {
    await expectReadError(
      sourceFromBytes('buoy.gltf', jsonBytes({ asset: { version: '1.0' } })),
      'asset.unsupported-version'
    );
  });

  it('rejects JSON that breaks the schema, naming the field', async () => {
    const json = gltfWithBufferUri(dataUriOf(BUOY_BIN));
    (json.accessors[1] as { count: number }).count = -4;
    const error = await expectReadError(sourceFromBytes('buoy.gltf', jsonBytes(json)), 'asset.structure-invalid');
    expect(error.message).toContain('accessors.1.count');
  });

  it('rejects an accessor that reads past its buffer view', async () => {
    const json = gltfWithBufferUri(dataUriOf(BUOY_BIN));
    json.accessors[1].count = 3;
    await expectReadError(sourceFromBytes('buoy.gltf', jsonBytes(json)), 'asset.buffer-too-short');
  });

  it('rejects a buffer holding fewer bytes than it declares', async () => {
    const json = gltfWithBufferUri(dataUriOf(BUOY_BIN.subarray(0, 20)));
    await expectReadError(sourceFromBytes('buoy.gltf', jsonBytes(json)), 'asset.buffer-too-short');
  });

  it('rejects a claimed gigabyte accessor without allocating it', async () => {
    const json = gltfWithBufferUri(dataUriOf(BUOY_BIN)) as ReturnType<typeof gltfWithBufferUri> & {
      accessors: object[];
    };
    json.accessors.push({ componentType: 5126, count: 1_000_000_000, type: 'MAT4' }); // 64 GB zero-filled
    const before = process.memoryUsage().rss;
    const error = await expectReadError(sourceFromBytes('buoy.gltf', jsonBytes(json)), 'asset.too-large');
    expect(error.message).toContain('accessors[2]');
    expect(process.memoryUsage().rss - before).toBeLessThan(64 * 1024 * 1024);
  });

  it('rejects many rotation channels sharing one large accessor, whose keys the rules would walk per channel', async () => {
    // 2 million zero-filled keys (no buffer view) fit the budget once; 40 channels over them would
    // cost the rules 40 walks of 2 million keys from a file of a few kilobytes.
    const json = gltfWithBufferUri(dataUriOf(BUOY_BIN)) as ReturnType<typeof gltfWithBufferUri> & {
      accessors: object[];
      animations: object[];
    };
    json.accessors.push(
      { componentType: 5126, count: 2_000_000, type: 'SCALAR' },
      { componentType: 5126, count: 2_000_000, type: 'VEC4' }
    );
    const sharing = {
      samplers: [{ input: 2, output: 3, interpolation: 'LINEAR' }],
      channels: [{ sampler: 0, target: { node: 0, path: 'rotation' } }]
    };
    const once = structuredClone(json);
    once.animations.push(sharing);
    expect(readRotationChannels(await readAssetDocument(sourceFromBytes('buoy.gltf', jsonBytes(once))))).toHaveLength(
      2
    );
    for (let copy = 0; copy < 40; copy++) json.animations.push(sharing);
    const error = await expectReadError(sourceFromBytes('buoy.gltf', jsonBytes(json)), 'asset.too-large');
    expect(error.message).toMatch(/animations\[\d+\]\.channels\[0\]/);
  });

  it('quotes at most 120 characters of a missing side file path', async () => {
    const longName = `${'x'.repeat(5000)}.bin`;
    const error = await expectReadError(
      sourceFromBytes('buoy.gltf', jsonBytes(gltfWithBufferUri(longName))),
      'asset.side-file-missing'
    );
    expect(error.message.length).toBeLessThan(300);
    expect(error.hint.length).toBeLessThan(300);
  });

  it('rejects a meshopt view claiming a gigabyte decoded size', async () => {
    const json = {
      ...gltfWithBufferUri(dataUriOf(BUOY_BIN)),
      extensionsUsed: ['EXT_meshopt_compression'],
      bufferViews: [
        {
          buffer: 0,
          byteLength: 40,
          extensions: {
            EXT_meshopt_compression: {
              buffer: 0,
              byteLength: 40,
              byteStride: 16,
              count: 100_000_000,
              mode: 'ATTRIBUTES'
            }
          }
        }
      ]
    };
    await expectReadError(sourceFromBytes('buoy.gltf', jsonBytes(json)), 'asset.too-large');
  });

  it('rejects a node hierarchy with a cycle', async () => {
    const json = { ...gltfWithBufferUri(dataUriOf(BUOY_BIN)), nodes: [{ children: [1] }, { children: [0] }] };
    const error = await expectReadError(sourceFromBytes('buoy.gltf', jsonBytes(json)), 'asset.structure-invalid');
    expect(error.message).toContain('cycle');
  });

  it('rejects an index that points at nothing', async () => {
    const json = gltfWithBufferUri(dataUriOf(BUOY_BIN));
    json.animations[0].channels[0].target.node = 7;
    const error = await expectReadError(sourceFromBytes('buoy.gltf', jsonBytes(json)), 'asset.structure-invalid');
    expect(error.message).toContain('nodes[7]');
  });

  it('rejects a required extension it does not know', async () => {
    const json = { ...gltfWithBufferUri(dataUriOf(BUOY_BIN)), extensionsRequired: ['LANTERNFISH_tide_packing'] };
    await expectReadError(sourceFromBytes('buoy.gltf', jsonBytes(json)), 'asset.extension-unsupported');
  });
});

describe('readAssetDocument: KHR_draco_mesh_compression', () => {
  async function dracoGlb(): Promise<Uint8Array> {
    const draco3d = (await import('draco3dgltf' as string)) as { createEncoderModule(): Promise<unknown> };
    const document = buoyDocument();
    const buffer = document.getRoot().listBuffers()[0];
    const positions = document
      .createAccessor()
      .setType('VEC3')
      .setArray(new Float32Array([0, 0, 0, 1, 0, 0, 0, 1, 0]))
      .setBuffer(buffer);
    const indices = document
      .createAccessor()
      .setType('SCALAR')
      .setArray(new Uint16Array([0, 1, 2]))
      .setBuffer(buffer);
    const primitive = document.createPrimitive().setAttribute('POSITION', positions).setIndices(indices);
    document.getRoot().listNodes()[0].setMesh(document.createMesh('Hull').addPrimitive(primitive));
    document.createExtension(KHRDracoMeshCompression).setRequired(true);
    const bytes = await writeGlb(document, [KHRDracoMeshCompression], {
      'draco3d.encoder': await draco3d.createEncoderModule()
    });
    return bytes;
  }

  it('reads the animation of a Draco file when no decoder is given, skipping the geometry', async () => {
    const glb = await dracoGlb();
    const { document, skippedDracoPrimitives } = await readAsset(sourceFromBytes('buoy.glb', glb));
    expect(skippedDracoPrimitives).toBe(1);
    const [channel] = readRotationChannels(document);
    expect(Array.from(channel.values)).toEqual(Array.from(IDENTITY_KEYS));
    const primitive = document.getRoot().listMeshes()[0].listPrimitives()[0];
    expect(primitive.getAttribute('POSITION')!.getCount()).toBe(0);
  });

  it('decodes the geometry when a Draco decoder is injected', async () => {
    const draco3d = (await import('draco3dgltf' as string)) as { createDecoderModule(): Promise<unknown> };
    const glb = await dracoGlb();
    const { document, skippedDracoPrimitives } = await readAsset(sourceFromBytes('buoy.glb', glb), {
      dracoDecoder: await draco3d.createDecoderModule()
    });
    expect(skippedDracoPrimitives).toBe(0);
    const primitive = document.getRoot().listMeshes()[0].listPrimitives()[0];
    expect(primitive.getAttribute('POSITION')!.getCount()).toBe(3);
    expect(readRotationChannels(document)).toHaveLength(1);
  });
});

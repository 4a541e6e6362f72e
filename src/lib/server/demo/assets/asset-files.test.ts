import { WebIO } from '@gltf-transform/core';
import { describe, expect, test } from 'vitest';
import { toDemoFiles, toGlb, toGltfFiles } from './asset-files';
import { createTideBuoy } from './tide-buoy';

describe('asset files', () => {
  test('toGlb writes a GLB container (magic "glTF", version 2)', async () => {
    const bytes = await toGlb(createTideBuoy());
    const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    // glTF 2.0 §4.4.2 GLB header: magic 0x46546C67, version 2, total length.
    expect(view.getUint32(0, true)).toBe(0x46546c67);
    expect(view.getUint32(4, true)).toBe(2);
    expect(view.getUint32(8, true)).toBe(bytes.byteLength);
  });

  test('toGltfFiles writes a .gltf and a .bin beside it, referenced by a relative URI', async () => {
    const files = await toGltfFiles(createTideBuoy(), 'props/tide-buoy.gltf');
    expect(files.map((file) => file.path)).toEqual(['props/tide-buoy.gltf', 'props/tide-buoy.bin']);
    const json = JSON.parse(new TextDecoder().decode(files[0].bytes));
    expect(json.buffers).toEqual([{ uri: 'tide-buoy.bin', byteLength: files[1].bytes.byteLength }]);
    const document = await new WebIO().readJSON({
      json,
      resources: { 'tide-buoy.bin': files[1].bytes as Uint8Array<ArrayBuffer> }
    });
    expect(
      document
        .getRoot()
        .listAnimations()
        .map((animation) => animation.getName())
    ).toEqual(['Swell']);
  });

  test('a .gltf at the build root gets its .bin at the root too', async () => {
    const files = await toGltfFiles(createTideBuoy(), 'buoy.gltf');
    expect(files.map((file) => file.path)).toEqual(['buoy.gltf', 'buoy.bin']);
  });

  test('toDemoFiles picks the container from the extension', async () => {
    expect((await toDemoFiles(createTideBuoy(), 'a/b.glb')).map((file) => file.path)).toEqual(['a/b.glb']);
    expect((await toDemoFiles(createTideBuoy(), 'a/b.gltf')).map((file) => file.path)).toEqual(['a/b.gltf', 'a/b.bin']);
  });

  test('toGltfFiles refuses a path that is not .gltf', async () => {
    await expect(toGltfFiles(createTideBuoy(), 'props/tide-buoy.obj')).rejects.toThrow(/ending in \.gltf/);
  });
});

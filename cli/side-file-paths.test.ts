import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Document, NodeIO } from '@gltf-transform/core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { listSideFileReferences, sideFilePathOf } from './side-file-paths';

describe('sideFilePathOf', () => {
  // glTF 2.0 §3.6.1.1: buffer and image URIs are RFC 3986 references, relative ones resolved
  // against the asset's location; percent-encoding decoded (RFC 3986 §2.1).
  const rows: { uri: string; path: string | null; refusal?: string }[] = [
    { uri: 'keeper.bin', path: 'keeper.bin' },
    { uri: './textures/sea%20foam.png', path: 'textures/sea foam.png' },
    { uri: 'anim/../keeper.bin', path: 'keeper.bin' },
    { uri: 'keeper.bin?v=2#frag', path: 'keeper.bin' },
    { uri: 'caf%C3%A9.bin', path: 'café.bin' },
    { uri: '../shared/rig.bin', path: null, refusal: 'climbs out' },
    { uri: 'a/../../rig.bin', path: null, refusal: 'climbs out' },
    { uri: '/srv/assets/rig.bin', path: null, refusal: 'absolute path' },
    { uri: 'https://cdn.example/rig.bin', path: null, refusal: 'absolute URI' },
    { uri: 'C:/rig.bin', path: null, refusal: 'absolute URI' },
    { uri: 'textures\\skin.png', path: null, refusal: 'backslash' },
    { uri: '%2e%2e/rig.bin', path: null, refusal: 'climbs out' },
    { uri: '%2Fetc%2Fpasswd', path: null, refusal: 'absolute path' },
    { uri: 'rig%00.bin', path: null, refusal: 'control characters' },
    { uri: 'rig%zz.bin', path: null, refusal: 'malformed percent-encoding' },
    { uri: './', path: null, refusal: 'names the folder itself' }
  ];
  for (const { uri, path, refusal } of rows) {
    it(`${path ? 'reads' : 'refuses'} ${JSON.stringify(uri)}${path ? ` as ${path}` : ''}`, () => {
      const result = sideFilePathOf(uri);
      expect(result.path).toBe(path);
      if (refusal) expect(result.refusal).toContain(refusal);
      else expect(result.refusal).toBeNull();
    });
  }
});

let folder: string;

beforeAll(async () => {
  folder = await mkdtemp(join(tmpdir(), 'orientry-side-files-'));
});
afterAll(async () => {
  await rm(folder, { recursive: true, force: true });
});

/** A GLB container (glTF 2.0 §4.4) holding `json` as its JSON chunk, padded with spaces to 4 bytes. */
function glbWith(json: object): Buffer {
  let text = JSON.stringify(json);
  while (text.length % 4 !== 0) text += ' ';
  const chunk = Buffer.from(text, 'utf8');
  const header = Buffer.alloc(20);
  header.writeUInt32LE(0x46546c67, 0); // "glTF"
  header.writeUInt32LE(2, 4);
  header.writeUInt32LE(20 + chunk.length, 8);
  header.writeUInt32LE(chunk.length, 12);
  header.writeUInt32LE(0x4e4f534a, 16); // "JSON"
  return Buffer.concat([header, chunk]);
}

describe('listSideFileReferences', () => {
  it('lists the buffers and images of a .gltf written by glTF-Transform, leaving data: URIs out', async () => {
    const document = new Document();
    const buffer = document.createBuffer().setURI('keeper-data.bin');
    document
      .createAccessor()
      .setType('SCALAR')
      .setArray(new Float32Array([0, 0.5, 1]))
      .setBuffer(buffer);
    document
      .createTexture('SeaFoam')
      .setURI('textures/sea foam.png')
      .setMimeType('image/png')
      .setImage(new Uint8Array(8));
    const { json } = await new NodeIO().writeJSON(document);
    json.buffers!.push({ byteLength: 4, uri: 'data:application/octet-stream;base64,AAAAAA==' });
    const path = join(folder, 'keeper.gltf');
    await writeFile(path, JSON.stringify(json));
    expect(await listSideFileReferences(path)).toEqual([
      { where: 'buffers[0]', uri: 'keeper-data.bin', path: 'keeper-data.bin', refusal: null },
      { where: 'images[0]', uri: 'textures/sea foam.png', path: 'textures/sea foam.png', refusal: null }
    ]);
  });

  it('reads the JSON chunk of a .glb that names an external buffer, and keeps refused ones with the reason', async () => {
    const path = join(folder, 'buoy.glb');
    await writeFile(
      path,
      glbWith({ asset: { version: '2.0' }, buffers: [{ byteLength: 4 }, { byteLength: 8, uri: '../rig.bin' }] })
    );
    expect(await listSideFileReferences(path)).toEqual([
      { where: 'buffers[1]', uri: '../rig.bin', path: null, refusal: 'climbs out of the asset folder' }
    ]);
  });

  it('finds nothing in a file that is not glTF JSON or is missing (the server reports it)', async () => {
    const path = join(folder, 'broken.gltf');
    await writeFile(path, '{ "buffers": [');
    expect(await listSideFileReferences(path)).toEqual([]);
    expect(await listSideFileReferences(join(folder, 'gone.gltf'))).toEqual([]);
  });
});

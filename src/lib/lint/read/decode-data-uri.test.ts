import { describe, expect, it } from 'vitest';
import { AssetReadError } from '../asset-read-error';
import { decodeDataUri } from './decode-data-uri';

const text = (bytes: Uint8Array) => new TextDecoder().decode(bytes);

describe('decodeDataUri', () => {
  // RFC 4648 §10 test vectors.
  const VECTORS = [
    ['', ''],
    ['Zg==', 'f'],
    ['Zm8=', 'fo'],
    ['Zm9v', 'foo'],
    ['Zm9vYg==', 'foob'],
    ['Zm9vYmE=', 'fooba'],
    ['Zm9vYmFy', 'foobar']
  ];
  for (const [encoded, decoded] of VECTORS) {
    it(`decodes the RFC 4648 vector "${encoded}" to "${decoded}"`, () => {
      expect(text(decodeDataUri(`data:application/gltf-buffer;base64,${encoded}`, 'a.gltf', 'buffers[0]'))).toBe(
        decoded
      );
    });
  }

  it('decodes every byte value the same way the platform base64 decoder does', () => {
    const bytes = Uint8Array.from({ length: 256 }, (_, index) => index);
    const encoded = Buffer.from(bytes).toString('base64');
    expect(decodeDataUri(`data:application/octet-stream;base64,${encoded}`, 'a.gltf', 'buffers[0]')).toEqual(bytes);
  });

  it('rejects padding in the middle, stray characters and whitespace', () => {
    for (const data of ['Zg==Zg==', 'Zm9v YmFy', 'Zm9-', 'Zm9vYmFy\n']) {
      expect(() => decodeDataUri(`data:;base64,${data}`, 'a.gltf', 'buffers[0]')).toThrow(AssetReadError);
    }
  });
});

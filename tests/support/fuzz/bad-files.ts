/**
 * The fuzz corpus: a deterministic stream of damaged and hostile glTF files made from the seed
 * rig (seed-assets.ts). Kinds take turns, so every run of N files covers each kind about N/15
 * times; all choices come from one seeded stream, so case i is the same file on every run.
 *
 * Kinds: truncated and bit-flipped GLBs, lying GLB chunk lengths, JSON that is not glTF,
 * accessors past their buffers, absurd counts and byte lengths (gigabyte claims), huge or
 * malformed data URIs, deeply nested JSON, non-UTF-8 and strange names, hostile URIs (`..`,
 * absolute, `file:`, `http:`), random JSON edits, damaged side files, garbage key data
 * (NaN, infinities, denormals in a well-formed file), many rotation channels sharing one large
 * accessor (a few kilobytes asking for millions of key walks) and plain random bytes.
 */
import { createFuzzRandom, type FuzzRandom } from './fuzz-random';
import { hostileUris, type HostileUri } from './hostile-uris';
import { mutateJson, randomJsonValue } from './json-mutations';
import { glbLayoutOf, packGlb } from './pack-glb';
import { gltfJsonOf, type SeedAssets } from './seed-assets';

/** The kinds of damage, in the order they take turns. */
export const FUZZ_KINDS = [
  'truncated-glb',
  'bit-flipped-glb',
  'chunk-lengths',
  'not-gltf',
  'accessor-past-buffer',
  'absurd-sizes',
  'data-uri',
  'deep-json',
  'non-utf8-names',
  'hostile-uri',
  'json-mutation',
  'side-file-damage',
  'garbage-data',
  'shared-accessors',
  'random-bytes'
] as const;

/** One kind of damage. */
export type FuzzKind = (typeof FUZZ_KINDS)[number];

/** One generated file with the side files offered next to it. */
export interface FuzzCase {
  index: number;
  kind: FuzzKind;
  /** File name, `case-0042-hostile-uri.gltf`; the extension says how the bytes are meant. */
  name: string;
  bytes: Uint8Array;
  /** Side files offered in the main file's folder, by relative path. */
  sideFiles: Record<string, Uint8Array>;
  /** The hostile URI this case carries, if it is a `hostile-uri` case. */
  hostileUri?: HostileUri;
}

/** Options of {@link generateBadFiles}. */
export interface BadFileOptions {
  /** Absolute paths of canary files outside the folder, aimed at by some hostile URIs. */
  absoluteTargets?: readonly string[];
  /** Largest data URI to make, in characters (default 16 MiB; huge ones are rare). */
  maxDataUriLength?: number;
}

/** What one kind's maker returns. */
interface Made {
  extension: 'glb' | 'gltf';
  bytes: Uint8Array;
  sideFiles?: Record<string, Uint8Array>;
  hostileUri?: HostileUri;
}

type Maker = (random: FuzzRandom, seed: SeedAssets, options: Required<BadFileOptions>) => Made;

const encoder = new TextEncoder();
const jsonBytes = (value: unknown) => encoder.encode(JSON.stringify(value));

/** Yields `count` cases from `randomSeed`; case i depends only on the seed and i's place in the stream. */
export function* generateBadFiles(
  seed: SeedAssets,
  randomSeed: number,
  count: number,
  options: BadFileOptions = {}
): Generator<FuzzCase> {
  const random = createFuzzRandom(randomSeed);
  const settled: Required<BadFileOptions> = {
    absoluteTargets: options.absoluteTargets ?? [],
    maxDataUriLength: options.maxDataUriLength ?? 16 * 1024 * 1024
  };
  for (let index = 0; index < count; index++) {
    const kind = FUZZ_KINDS[index % FUZZ_KINDS.length];
    const made = MAKERS[kind](random, seed, settled);
    yield {
      index,
      kind,
      name: `case-${String(index).padStart(4, '0')}-${kind}.${made.extension}`,
      bytes: made.bytes,
      sideFiles: made.sideFiles ?? {},
      hostileUri: made.hostileUri
    };
  }
}

/** The seed as .gltf text with its side files, or as a GLB holding the same JSON and the .bin. */
function asFile(random: FuzzRandom, seed: SeedAssets, json: unknown): Made {
  if (random.chance(0.5)) return { extension: 'gltf', bytes: jsonBytes(json), sideFiles: { ...seed.sideFiles } };
  const glbJson = structuredClone(json) as { buffers?: { uri?: string }[] };
  if (Array.isArray(glbJson?.buffers) && glbJson.buffers[0] && typeof glbJson.buffers[0] === 'object') {
    delete glbJson.buffers[0].uri;
  }
  return {
    extension: 'glb',
    bytes: packGlb(jsonBytes(glbJson), seed.sideFiles[seed.binName]),
    sideFiles: { [seed.imageName]: seed.sideFiles[seed.imageName] }
  };
}

type GltfJson = Record<string, unknown> & {
  accessors: Record<string, unknown>[];
  bufferViews: Record<string, unknown>[];
  buffers: Record<string, unknown>[];
  images: Record<string, unknown>[];
  nodes: Record<string, unknown>[];
  skins: Record<string, unknown>[];
  animations: { name?: string; samplers: Record<string, unknown>[]; extras?: unknown }[];
};

const seedJson = (seed: SeedAssets) => gltfJsonOf(seed) as GltfJson;

const GIGANTIC = [2 ** 31 - 1, 2 ** 31, 2 ** 32, 2 ** 32 + 4, 4e9, 2 ** 40, 1e15, 2 ** 53 - 1, 1e300, -1, 1.5];
const LENGTH_LIES = (length: number) => [0, 1, 3, 4, 8, length - 1, length + 1, length + 4, 0x7fffffff, 0xffffffff];

const MAKERS: Record<FuzzKind, Maker> = {
  'truncated-glb'(random, seed) {
    const roll = random.integer(0, 9);
    const cut = roll === 0 ? 0 : roll < 4 ? random.integer(1, 24) : random.integer(0, seed.glb.byteLength - 1);
    return { extension: 'glb', bytes: seed.glb.slice(0, cut) };
  },

  'bit-flipped-glb'(random, seed) {
    const bytes = seed.glb.slice();
    const { jsonByteLength } = glbLayoutOf(seed.glb);
    const flips = random.integer(1, 12);
    for (let flip = 0; flip < flips; flip++) {
      const region = random.integer(0, 9);
      const position =
        region < 5
          ? random.integer(20, 20 + jsonByteLength - 1)
          : region < 7
            ? random.integer(0, 19)
            : random.integer(0, bytes.byteLength - 1);
      bytes[position] ^= 1 << random.integer(0, 7);
    }
    return { extension: 'glb', bytes };
  },

  'chunk-lengths'(random, seed) {
    const bytes = seed.glb.slice();
    const view = new DataView(bytes.buffer);
    const { jsonByteLength, binChunkStart } = glbLayoutOf(seed.glb);
    const fields = [8, 12, 16, 4, binChunkStart, binChunkStart + 4];
    const edits = random.integer(1, 2);
    for (let edit = 0; edit < edits; edit++) {
      const offset = random.pick(fields);
      const current = view.getUint32(offset, true);
      const lies = [...LENGTH_LIES(current), ...LENGTH_LIES(jsonByteLength), random.integer(0, 0xffffffff)];
      view.setUint32(offset, random.pick(lies) >>> 0, true);
    }
    if (random.chance(0.2)) {
      // A trailing chunk that claims more than the file holds.
      const extra = new Uint8Array(bytes.byteLength + 8);
      extra.set(bytes);
      const extraView = new DataView(extra.buffer);
      extraView.setUint32(bytes.byteLength, random.pick(GIGANTIC.filter((n) => n > 0 && n < 2 ** 32)) >>> 0, true);
      extraView.setUint32(bytes.byteLength + 4, 0x004e4942, true);
      extraView.setUint32(8, extra.byteLength, true);
      return { extension: 'glb', bytes: extra };
    }
    return { extension: 'glb', bytes };
  },

  'not-gltf'(random) {
    const texts = [
      '',
      '   ',
      '[]',
      'null',
      'true',
      '0',
      '"glTF"',
      '{}',
      '{"asset":null}',
      '{"asset":[]}',
      '{"asset":"2.0"}',
      '{"asset":{}}',
      '{"asset":{"version":2}}',
      '{"asset":{"version":"1.0"}}',
      '{"asset":{"version":"3.0"}}',
      '{"asset":{"version":"2.0"},"nodes":{}}',
      '{"asset":{"version":"2.0"},"accessors":"all"}',
      '{"asset":{"version":"2.0"},"animations":[{"channels":[],"samplers":null}]}',
      '{"__proto__":{"polluted":1},"asset":{"version":"2.0"}}',
      '{"constructor":{"prototype":{"polluted":1}},"asset":{"version":"2.0"}}',
      '{"asset":{"version":"2.0"},"nodes":[{"__proto__":{"children":[0]}}]}',
      '{"asset":{"version":"2.0"},"asset":5}',
      '{"asset":{"version":"2.0"}} trailing',
      '{"asset":{"version":"2.0"},"buffers":[{"byteLength":1e400}]}',
      '{"asset":{"version":"2.0"',
      'hello, world',
      '<!doctype html><script>window.__xss=1</script>',
      'PK\u0003\u0004 not a zip either',
      '\ufeff{"asset":{"version":"2.0"}}',
      '\ufeff\ufeff{"asset":{"version":"2.0"}}'
    ];
    const choice = random.integer(0, 9);
    let bytes: Uint8Array;
    if (choice < 5) bytes = encoder.encode(random.pick(texts));
    else if (choice < 8) bytes = jsonBytes(randomJsonValue(random, 4));
    else if (choice === 8) {
      // UTF-16 with a byte order mark: glTF JSON must be UTF-8 (glTF 2.0 §3.1).
      const text = '{"asset":{"version":"2.0"}}';
      bytes = new Uint8Array(2 + text.length * 2);
      bytes[0] = 0xff;
      bytes[1] = 0xfe;
      for (let index = 0; index < text.length; index++) bytes[2 + index * 2] = text.charCodeAt(index);
    } else bytes = random.bytes(random.integer(1, 512));
    if (random.chance(0.3)) return { extension: 'glb', bytes: packGlb(bytes) };
    return { extension: 'gltf', bytes };
  },

  'accessor-past-buffer'(random, seed) {
    const json = seedJson(seed);
    const accessor = random.pick(json.accessors);
    const bufferView = random.pick(json.bufferViews);
    switch (random.integer(0, 8)) {
      case 0:
        accessor.byteOffset = Number(accessor.byteOffset ?? 0) + random.integer(1, 1_000_000);
        break;
      case 1:
        accessor.count = Number(accessor.count) + random.integer(1, 1000);
        break;
      case 2:
        bufferView.byteLength = Number(bufferView.byteLength) + random.integer(1, 100_000);
        break;
      case 3:
        bufferView.byteOffset = Number(bufferView.byteOffset ?? 0) + random.integer(1, 100_000);
        break;
      case 4:
        accessor.bufferView = json.bufferViews.length + random.integer(0, 5);
        break;
      case 5:
        bufferView.buffer = random.integer(1, 5);
        break;
      case 6:
        bufferView.byteStride = random.integer(1, 63) * 4;
        break;
      case 7:
        accessor.sparse = {
          count: random.integer(1, 100_000),
          indices: { bufferView: 0, byteOffset: random.integer(0, 1000), componentType: 5125 },
          values: { bufferView: 1, byteOffset: random.integer(0, 1000) }
        };
        break;
      default:
        random.pick(json.animations[0].samplers)[random.chance(0.5) ? 'input' : 'output'] =
          json.accessors.length + random.integer(0, 3);
    }
    return asFile(random, seed, json);
  },

  'absurd-sizes'(random, seed) {
    const json = seedJson(seed);
    const edits = random.integer(1, 3);
    for (let edit = 0; edit < edits; edit++) {
      switch (random.integer(0, 6)) {
        case 0:
          random.pick(json.accessors).count = random.pick(GIGANTIC);
          break;
        case 1:
          json.buffers[0].byteLength = random.pick(GIGANTIC);
          break;
        case 2:
          random.pick(json.bufferViews).byteLength = random.pick(GIGANTIC);
          break;
        case 3:
          random.pick(json.bufferViews).byteOffset = random.pick(GIGANTIC);
          break;
        case 4: {
          // No buffer view: the reader would allocate `count` zero elements itself.
          const accessor = random.pick(json.accessors);
          delete accessor.bufferView;
          delete accessor.byteOffset;
          accessor.count = random.pick([random.integer(100_000, 50_000_000), ...GIGANTIC]);
          break;
        }
        case 5: {
          const view = random.pick(json.bufferViews);
          json.extensionsUsed = ['EXT_meshopt_compression'];
          view.extensions = {
            EXT_meshopt_compression: {
              buffer: 0,
              byteOffset: 0,
              byteLength: 16,
              byteStride: 4,
              count: random.pick(GIGANTIC.filter((n) => Number.isInteger(n) && n > 0)),
              mode: 'ATTRIBUTES'
            }
          };
          break;
        }
        default:
          random.pick(json.accessors).sparse = {
            count: random.pick(GIGANTIC),
            indices: { bufferView: 0, componentType: 5125 },
            values: { bufferView: 1 }
          };
      }
    }
    return asFile(random, seed, json);
  },

  'data-uri'(random, seed, options) {
    const json = seedJson(seed);
    const bin = seed.sideFiles[seed.binName];
    const valid = `data:application/octet-stream;base64,${Buffer.from(bin).toString('base64')}`;
    const base64 = valid.slice(valid.indexOf(',') + 1);
    const withCharAt = (text: string, char: string) => {
      const position = random.integer(0, text.length - 1);
      return text.slice(0, position) + char + text.slice(position + 1);
    };
    const variants = [
      () => valid,
      () => 'data:application/octet-stream;base64',
      () => `data:application/octet-stream,${'raw bytes'.repeat(10)}`,
      () =>
        `data:application/octet-stream;base64,${withCharAt(base64, random.pick(['!', '-', '_', 'é', '\u0000', ' ']))}`,
      () => `data:application/octet-stream;base64,${base64.slice(0, base64.length - random.integer(1, 3))}`,
      () => `data:application/octet-stream;base64,${withCharAt(base64, '=')}`,
      () => `data:application/octet-stream;base64,${base64.slice(0, 40)}\n${base64.slice(40)}`,
      () => `DATA:text/html;BASE64,${base64}`,
      () => `data:;base64,${base64}`,
      () => `data:application/octet-stream;base64,${base64}`.replace('base64,', 'base64;charset=utf-8,'),
      () => `data:application/octet-stream;base64,${'A'.repeat(4 * random.integer(1, 4096))}`,
      () => `data:application/octet-stream;base64,${'%41'.repeat(64)}`
    ];
    let uri = random.pick(variants)();
    if (random.chance(0.06)) {
      // Huge: up to maxDataUriLength characters; sometimes broken at the very end.
      const length = Math.floor(random.integer(options.maxDataUriLength / 4, options.maxDataUriLength) / 4) * 4;
      uri = `data:application/octet-stream;base64,${'QUJD'.repeat(length / 4)}${random.chance(0.5) ? '!' : ''}`;
    }
    if (random.chance(0.3)) json.buffers[0].byteLength = Number(json.buffers[0].byteLength) + random.integer(1, 1e6);
    json.buffers[0].uri = uri;
    if (random.chance(0.25)) json.images[0].uri = random.pick(variants)();
    return {
      extension: 'gltf',
      bytes: jsonBytes(json),
      sideFiles: { [seed.imageName]: seed.sideFiles[seed.imageName] }
    };
  },

  'deep-json'(random, seed) {
    const depth = random.pick([64, 1_000, 10_000, 100_000, 400_000]);
    const isArray = random.chance(0.5);
    const nested = isArray ? '['.repeat(depth) + ']'.repeat(depth) : '{"a":'.repeat(depth) + '1' + '}'.repeat(depth);
    const json = seedJson(seed);
    const marker = '"__deep__"';
    const place = random.integer(0, 5);
    if (place === 0) json.extras = '__deep__';
    else if (place === 1) json.nodes[0].extras = '__deep__';
    else if (place === 2) json.animations[0].extras = '__deep__';
    else if (place === 3) (json.asset as Record<string, unknown>).extras = '__deep__';
    else if (place === 4) json.nodes[0].children = '__deep__' as never;
    else {
      const text = random.chance(0.5) ? nested : `{"asset":{"version":"2.0"},"extras":${nested}`;
      return { extension: 'gltf', bytes: encoder.encode(text) };
    }
    const text = JSON.stringify(json).replace(marker, nested);
    if (random.chance(0.4)) {
      return {
        extension: 'glb',
        bytes: packGlb(encoder.encode(text.replace('"uri":"fuzz.bin",', '')), seed.sideFiles[seed.binName]),
        sideFiles: { ...seed.sideFiles }
      };
    }
    return { extension: 'gltf', bytes: encoder.encode(text), sideFiles: { ...seed.sideFiles } };
  },

  'non-utf8-names'(random, seed) {
    const json = seedJson(seed);
    const invalid = [
      [0xff],
      [0xfe, 0xff],
      [0xc3, 0x28],
      [0xc0, 0xaf],
      [0xed, 0xa0, 0x80],
      [0xf4, 0x90, 0x80, 0x80],
      [0xe2, 0x82],
      [0x80],
      [0xf8, 0x88, 0x80, 0x80, 0x80]
    ];
    const strange = [
      '\u0000',
      '\ud800',
      '\udfff\ud800',
      '\u202eflipped',
      'zero\u200bwidth',
      'e\u0301',
      '\u00e9',
      '<img src=x onerror=window.__xss=1>',
      '<script>window.__xss=1</script>',
      '"; DROP TABLE builds; --',
      '${7*7}{{7*7}}',
      'x'.repeat(70_000),
      '🦑'.repeat(1000)
    ];
    const target = random.pick(['node', 'animation', 'skin', 'mesh']);
    const setName = (name: string) => {
      if (target === 'node') random.pick(json.nodes).name = name;
      else if (target === 'animation') json.animations[0].name = name;
      else if (target === 'skin') json.skins[0].name = name;
      else (json.meshes as Record<string, unknown>[])[0].name = name;
    };
    if (random.chance(0.5)) {
      setName(random.pick(strange));
      return asFile(random, seed, json);
    }
    setName('@@NAME@@');
    const text = JSON.stringify(json);
    const at = text.indexOf('@@NAME@@');
    const bad = random.pick(invalid);
    const bytes = new Uint8Array([
      ...encoder.encode(text.slice(0, at)),
      ...bad,
      ...encoder.encode(text.slice(at + '@@NAME@@'.length))
    ]);
    if (random.chance(0.5)) return { extension: 'gltf', bytes, sideFiles: { ...seed.sideFiles } };
    return { extension: 'glb', bytes: packGlb(bytes, seed.sideFiles[seed.binName]), sideFiles: { ...seed.sideFiles } };
  },

  'hostile-uri'(random, seed, options) {
    const json = seedJson(seed);
    const hostile = random.pick(hostileUris(options.absoluteTargets));
    const sideFiles = { ...seed.sideFiles };
    if (random.chance(0.7)) json.buffers[0].uri = hostile.uri;
    else json.images[0].uri = hostile.uri;
    if (random.chance(0.2)) {
      // A second buffer with another hostile URI, so two reads are attempted at once.
      json.buffers.push({ uri: random.pick(hostileUris(options.absoluteTargets)).uri, byteLength: 4 });
    }
    return { extension: 'gltf', bytes: jsonBytes(json), sideFiles, hostileUri: hostile };
  },

  'json-mutation'(random, seed) {
    const json = mutateJson(seedJson(seed) as never, random, random.integer(1, 6));
    return asFile(random, seed, json);
  },

  'side-file-damage'(random, seed) {
    const json = seedJson(seed);
    const bin = seed.sideFiles[seed.binName];
    const sideFiles: Record<string, Uint8Array> = { ...seed.sideFiles };
    switch (random.integer(0, 5)) {
      case 0:
        delete sideFiles[seed.binName];
        break;
      case 1:
        sideFiles[seed.binName] = new Uint8Array(0);
        break;
      case 2:
        sideFiles[seed.binName] = bin.slice(0, random.integer(0, bin.byteLength - 1));
        break;
      case 3:
        sideFiles[seed.binName] = random.bytes(bin.byteLength);
        break;
      case 4:
        sideFiles[seed.binName.toUpperCase()] = bin;
        delete sideFiles[seed.binName];
        break;
      default:
        sideFiles[seed.binName] = new Uint8Array([...bin, ...random.bytes(random.integer(1, 4096))]);
    }
    return { extension: 'gltf', bytes: jsonBytes(json), sideFiles };
  },

  'garbage-data'(random, seed) {
    const bin = seed.sideFiles[seed.binName].slice();
    const floats = new Float32Array(bin.buffer, bin.byteOffset, bin.byteLength / 4);
    const specials = [NaN, Infinity, -Infinity, -0, 0, 1e38, -1e38, 1e-45, 1, -1, 0.7071068];
    const start = random.integer(0, floats.length - 1);
    const length = random.integer(1, floats.length - start);
    for (let index = start; index < start + length; index++) {
      floats[index] = random.chance(0.5) ? random.pick(specials) : (random.next() - 0.5) * 10 ** random.integer(-3, 6);
    }
    const json = seedJson(seed);
    if (random.chance(0.5)) {
      return { extension: 'gltf', bytes: jsonBytes(json), sideFiles: { ...seed.sideFiles, [seed.binName]: bin } };
    }
    delete json.buffers[0].uri;
    return {
      extension: 'glb',
      bytes: packGlb(jsonBytes(json), bin),
      sideFiles: { [seed.imageName]: seed.sideFiles[seed.imageName] }
    };
  },

  'shared-accessors'(random, seed) {
    const json = seedJson(seed);
    const count = random.pick([1_000, 20_000, 100_000, 400_000, 2_000_000]);
    // The Mast channel's input and output, zero-filled by the reader (no buffer view).
    for (const accessorIndex of [3, 4]) {
      const accessor = json.accessors[accessorIndex];
      delete accessor.bufferView;
      delete accessor.byteOffset;
      delete accessor.min;
      delete accessor.max;
      accessor.count = count;
    }
    const channelCount = random.integer(2, 400);
    const isOneAnimation = random.chance(0.5);
    const sampler = { input: 3, output: 4, interpolation: random.pick(['LINEAR', 'STEP', 'CUBICSPLINE']) };
    if (isOneAnimation) {
      json.animations.push({
        name: 'Echo',
        samplers: [sampler],
        channels: Array.from({ length: channelCount }, (_, index) => ({
          sampler: 0,
          target: { node: index % json.nodes.length, path: 'rotation' }
        }))
      } as never);
    } else {
      for (let index = 0; index < channelCount; index++) {
        json.animations.push({
          name: `Echo ${index}`,
          samplers: [sampler],
          channels: [{ sampler: 0, target: { node: index % json.nodes.length, path: 'rotation' } }]
        } as never);
      }
    }
    return asFile(random, seed, json);
  },

  'random-bytes'(random) {
    const bytes = random.bytes(random.integer(0, 4096));
    const roll = random.integer(0, 9);
    if (roll < 3 && bytes.byteLength >= 12) {
      const view = new DataView(bytes.buffer);
      view.setUint32(0, 0x46546c67, true);
      view.setUint32(4, 2, true);
      if (random.chance(0.5)) view.setUint32(8, bytes.byteLength, true);
      return { extension: 'glb', bytes };
    }
    if (roll < 5 && bytes.byteLength > 0) bytes[0] = 0x7b;
    return { extension: random.chance(0.5) ? 'glb' : 'gltf', bytes };
  }
};

/**
 * Hostile upload envelopes for the route fuzz test: the multipart body around a valid asset is
 * what is damaged. File names that climb out (`..`, absolute, drive letters, backslashes, NUL,
 * control characters, names too long for the file system, look-alike dots), broken multipart
 * framing, broken `meta` parts and wrong part sets. Deterministic from a seed like bad-files.ts.
 */
import { createFuzzRandom, type FuzzRandom } from './fuzz-random';
import { filePart, metaPart, rawMultipart, type RawPart } from './raw-multipart';

/** One hostile upload. */
export interface BadEnvelope {
  index: number;
  description: string;
  contentType: string;
  body: Buffer;
}

/** File names that must never land outside the upload folder (each also aims at `escaped.glb`). */
export const HOSTILE_UPLOAD_NAMES: readonly (string | Buffer)[] = [
  '../escaped.glb',
  '../../escaped.glb',
  '../../../../escaped.glb',
  'chars/../../escaped.glb',
  '..',
  '.',
  './escaped.glb',
  'chars/./escaped.glb',
  '/tmp/escaped.glb',
  '/escaped.glb',
  '//server/share/escaped.glb',
  'C:/escaped.glb',
  'c:escaped.glb',
  'C:\\escaped.glb',
  '\\\\server\\share\\escaped.glb',
  'chars\\..\\..\\escaped.glb',
  '..\\escaped.glb',
  'chars//escaped.glb',
  'chars/',
  '',
  'escaped\u0001.glb',
  'escaped\u007f.glb',
  'esc\naped.glb',
  'a%2f..%2f..%2fescaped.glb',
  '%2e%2e/escaped.glb',
  '\uff0e\uff0e/escaped.glb',
  '\u2025/escaped.glb',
  '.\u200b./escaped.glb',
  'e\u0301scaped.glb',
  '\u202eblg.depacse',
  `${'x'.repeat(300)}.glb`,
  `${'é'.repeat(200)}.glb`,
  `${'chars/'.repeat(180)}escaped.glb`,
  `${'a'.repeat(1100)}.glb`,
  Buffer.from([0xff, 0xfe, 0x2e, 0x67, 0x6c, 0x62]),
  Buffer.from([0x2e, 0x2e, 0xc0, 0xaf, 0x65, 0x2e, 0x67, 0x6c, 0x62])
];

type EnvelopeMaker = (random: FuzzRandom, asset: Uint8Array, boundary: string) => Omit<BadEnvelope, 'index'>;

const META = JSON.stringify({ branch: 'fuzz', label: 'envelope' });
const multipartType = (boundary: string) => `multipart/form-data; boundary=${boundary}`;

const MAKERS: EnvelopeMaker[] = [
  function hostileName(random, asset, boundary) {
    const name = random.pick(HOSTILE_UPLOAD_NAMES);
    return {
      description: `file name ${JSON.stringify(name.toString())}`,
      contentType: multipartType(boundary),
      body: rawMultipart([metaPart(META), filePart(name, asset)], boundary)
    };
  },

  function brokenFraming(random, asset, boundary) {
    const parts = [metaPart(META), filePart('chars/ok.glb', asset)];
    const whole = rawMultipart(parts, boundary);
    const variants: [string, string, Buffer][] = [
      ['truncated body', multipartType(boundary), whole.subarray(0, random.integer(1, whole.length - 10))],
      ['no closing boundary', multipartType(boundary), rawMultipart(parts, boundary, { isUnterminated: true })],
      ['header names another boundary', multipartType(`${boundary}-other`), whole],
      ['no boundary parameter', 'multipart/form-data', whole],
      ['not multipart', 'application/octet-stream', Buffer.from(asset)],
      ['empty body', multipartType(boundary), Buffer.alloc(0)],
      ['random bytes', multipartType(boundary), Buffer.from(random.bytes(random.integer(1, 2048)))],
      [
        'part without Content-Disposition',
        multipartType(boundary),
        rawMultipart([metaPart(META), { headers: ['Content-Type: application/octet-stream'], body: asset }], boundary)
      ],
      [
        'part header line of 100 KB',
        multipartType(boundary),
        rawMultipart([metaPart(META), { headers: [`X-Long: ${'h'.repeat(100_000)}`], body: asset }], boundary)
      ]
    ];
    const [description, contentType, body] = random.pick(variants);
    return { description, contentType, body };
  },

  function brokenMeta(random, asset, boundary) {
    const file = filePart('chars/ok.glb', asset);
    const variants: [string, RawPart[]][] = [
      ['meta not JSON', [metaPart('{branch: main'), file]],
      ['meta without branch', [metaPart('{}'), file]],
      ['meta with an unknown key', [metaPart('{"branch":"fuzz","brnach":"x"}'), file]],
      ['meta is an array', [metaPart('[1,2,3]'), file]],
      ['meta branch with a control character', [metaPart('{"branch":"fu\\u0000zz"}'), file]],
      ['meta of 70 KB', [metaPart(JSON.stringify({ branch: 'fuzz', label: 'l'.repeat(70_000) })), file]],
      ['two meta parts', [metaPart(META), metaPart(META), file]],
      ['meta missing', [file]],
      ['meta deeply nested', [metaPart(`{"branch":"fuzz","label":${'['.repeat(20_000)}${']'.repeat(20_000)}}`), file]],
      ['meta builtAt far ahead', [metaPart('{"branch":"fuzz","builtAt":"2999-01-01T00:00:00Z"}'), file]],
      ['meta with a javascript: job link', [metaPart('{"branch":"fuzz","ciJobUrl":"javascript:alert(1)"}'), file]]
    ];
    const [description, parts] = random.pick(variants);
    return { description, contentType: multipartType(boundary), body: rawMultipart(parts, boundary) };
  },

  function wrongParts(random, asset, boundary) {
    const variants: [string, RawPart[]][] = [
      ['no file part', [metaPart(META)]],
      ['only a side file', [metaPart(META), filePart('chars/ok.bin', asset)]],
      ['a path sent twice', [metaPart(META), filePart('chars/ok.glb', asset), filePart('chars/ok.glb', asset)]],
      ['a file and a folder of one name', [metaPart(META), filePart('chars', asset), filePart('chars/ok.glb', asset)]],
      [
        'an unexpected field',
        [metaPart(META), { headers: ['Content-Disposition: form-data; name="token"'], body: 'x' }]
      ],
      [
        'eleven extra fields',
        [
          metaPart(META),
          ...Array.from({ length: 11 }, (_, index) => ({
            headers: [`Content-Disposition: form-data; name="f${index}"`],
            body: 'x'
          }))
        ]
      ]
    ];
    const [description, parts] = random.pick(variants);
    return { description, contentType: multipartType(boundary), body: rawMultipart(parts, boundary) };
  }
];

/** Yields `count` hostile envelopes around `asset` (a valid GLB), from `randomSeed`. */
export function* generateBadEnvelopes(randomSeed: number, count: number, asset: Uint8Array): Generator<BadEnvelope> {
  const random = createFuzzRandom(randomSeed);
  for (let index = 0; index < count; index++) {
    const boundary = `----orientry-fuzz-${index}-${random.integer(0, 1e9)}`;
    yield { index, ...MAKERS[index % MAKERS.length](random, asset, boundary) };
  }
}

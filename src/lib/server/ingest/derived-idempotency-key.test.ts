import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { deriveIdempotencyKey, type IdempotencyInput } from './derived-idempotency-key';

const sha = (text: string) => createHash('sha256').update(text).digest('hex');

const BASE: IdempotencyInput = {
  project: 'tidewatch',
  branch: 'feature/lantern-arm',
  commit: '3f2a9c1d',
  label: '#1482',
  files: [
    { uploadPath: 'chars/keeper.gltf', sha256: sha('keeper json') },
    { uploadPath: 'chars/keeper.bin', sha256: sha('keeper buffer') },
    { uploadPath: 'props/buoy.glb', sha256: sha('buoy') }
  ]
};

/** deriveIdempotencyKey(BASE) as orientry submit 0.1.0 derived it on the CI machine. */
const PREVIOUS_CLI_KEY = 'cli1-02535117bb4a8a746f788056c3f6453bde6df0999c2adc852645b39cc8fc2ff3';

describe('deriveIdempotencyKey', () => {
  it('gives the same key for the same build, whatever order the files were collected in', () => {
    const reversed = { ...BASE, files: [...BASE.files].reverse() };
    expect(deriveIdempotencyKey(reversed)).toBe(deriveIdempotencyKey(BASE));
  });

  it('is the SHA-256 of a canonical JSON text, so any client can reproduce it', () => {
    // Node's crypto SHA-256 (FIPS 180-4) over the documented canonical form, as an outside check.
    const canonical = JSON.stringify([
      'orientry-submit-v1',
      'tidewatch',
      'feature/lantern-arm',
      '3f2a9c1d',
      '#1482',
      [
        ['chars/keeper.bin', sha('keeper buffer')],
        ['chars/keeper.gltf', sha('keeper json')],
        ['props/buoy.glb', sha('buoy')]
      ]
    ]);
    expect(deriveIdempotencyKey(BASE)).toBe(`cli1-${sha(canonical)}`);
  });

  it('fits the server limit of 200 characters', () => {
    expect(deriveIdempotencyKey(BASE)).toMatch(/^cli1-[0-9a-f]{64}$/);
  });

  it('stays the formula earlier CLIs used, so a build they stored is matched (a value they derived)', () => {
    expect(deriveIdempotencyKey(BASE)).toBe(PREVIOUS_CLI_KEY);
  });

  it('tells a build without a commit from one with it', () => {
    expect(deriveIdempotencyKey({ ...BASE, commit: null })).not.toBe(deriveIdempotencyKey(BASE));
  });

  const changes: { name: string; input: IdempotencyInput }[] = [
    { name: 'the project', input: { ...BASE, project: 'tidewatch-dlc' } },
    { name: 'the branch', input: { ...BASE, branch: 'main' } },
    { name: 'the commit', input: { ...BASE, commit: '3f2a9c1e' } },
    { name: 'the label (another CI run)', input: { ...BASE, label: '#1483' } },
    { name: 'a missing label', input: { ...BASE, label: null } },
    {
      name: "one file's content",
      input: { ...BASE, files: [...BASE.files.slice(0, 2), { uploadPath: 'props/buoy.glb', sha256: sha('buoy v2') }] }
    },
    {
      name: "one file's path (same bytes, new name)",
      input: { ...BASE, files: [...BASE.files.slice(0, 2), { uploadPath: 'props/float.glb', sha256: sha('buoy') }] }
    },
    { name: 'a file left out', input: { ...BASE, files: BASE.files.slice(0, 2) } }
  ];

  for (const { name, input } of changes) {
    it(`changes with ${name}`, () => {
      expect(deriveIdempotencyKey(input)).not.toBe(deriveIdempotencyKey(BASE));
    });
  }

  it('keeps a path and its hash together, so swapping two files contents changes the key', () => {
    const [a, b] = BASE.files;
    const swapped = { ...BASE, files: [{ ...a, sha256: b.sha256 }, { ...b, sha256: a.sha256 }, BASE.files[2]] };
    expect(deriveIdempotencyKey(swapped)).not.toBe(deriveIdempotencyKey(BASE));
  });
});

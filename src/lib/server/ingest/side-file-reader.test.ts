import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createSideFileReader, readInside } from './side-file-reader';

let root: string;
let files: string;

beforeAll(() => {
  root = fs.mkdtempSync(path.join(os.tmpdir(), 'orientry-side-files-'));
  files = path.join(root, 'files');
  fs.mkdirSync(path.join(files, 'chars', 'textures'), { recursive: true });
  fs.mkdirSync(path.join(files, 'props'), { recursive: true });
  fs.writeFileSync(path.join(files, 'chars', 'hero.bin'), 'hero buffer');
  fs.writeFileSync(path.join(files, 'chars', '..hidden.bin'), 'dotted name');
  fs.writeFileSync(path.join(files, 'chars', 'textures', 'skin.png'), 'png');
  fs.writeFileSync(path.join(files, 'props', 'buoy.bin'), 'buoy buffer');
  fs.writeFileSync(path.join(root, 'secret.txt'), 'outside the upload');
  fs.symlinkSync(path.join(root, 'secret.txt'), path.join(files, 'chars', 'link-out.bin'));
  fs.symlinkSync(path.join(files, 'chars', 'hero.bin'), path.join(files, 'chars', 'link-in.bin'));
  fs.symlinkSync(root, path.join(files, 'chars', 'folder-out'));
});

afterAll(() => fs.rmSync(root, { recursive: true, force: true }));

const text = (bytes: Uint8Array | null) => (bytes === null ? null : Buffer.from(bytes).toString('utf8'));

describe('readInside', () => {
  it('reads a file of the folder and of a subfolder', async () => {
    const chars = path.join(files, 'chars');
    expect(text(await readInside(chars, 'hero.bin'))).toBe('hero buffer');
    expect(text(await readInside(chars, 'textures/skin.png'))).toBe('png');
    expect(text(await readInside(chars, '..hidden.bin'))).toBe('dotted name');
  });

  it('follows a link that stays inside the folder', async () => {
    expect(text(await readInside(path.join(files, 'chars'), 'link-in.bin'))).toBe('hero buffer');
  });

  it.each([
    { relativePath: '../props/buoy.bin', why: 'a sibling folder of the upload' },
    { relativePath: '../../secret.txt', why: 'a file outside the upload' },
    { relativePath: 'link-out.bin', why: 'a link pointing outside' },
    { relativePath: 'folder-out/secret.txt', why: 'a path through a linked folder outside' },
    { relativePath: '/etc/hostname', why: 'an absolute path' },
    { relativePath: 'missing.bin', why: 'a file that was not sent' },
    { relativePath: 'textures', why: 'a folder' },
    { relativePath: 'hero.bin/x', why: 'a path through a file' },
    { relativePath: 'hero\u0000.bin', why: 'a NUL character' },
    { relativePath: '.', why: 'the folder itself' }
  ])('gives null for $why ($relativePath)', async ({ relativePath }) => {
    expect(await readInside(path.join(files, 'chars'), relativePath)).toBeNull();
  });
});

describe('createSideFileReader', () => {
  it('reads relative to the asset folder and records the digest of each file asked for', async () => {
    const digests: Record<string, string> = { 'chars/hero.bin': 'a'.repeat(64) };
    const reader = createSideFileReader(files, 'chars/hero.gltf', (uploadPath) => digests[uploadPath]);
    expect(text(await reader.readSideFile('hero.bin'))).toBe('hero buffer');
    expect(await reader.readSideFile('absent.bin')).toBeNull();
    expect(await reader.readSideFile('../props/buoy.bin')).toBeNull();
    expect(reader.requested).toEqual({ 'hero.bin': 'a'.repeat(64), 'absent.bin': null, '../props/buoy.bin': null });
  });

  it('reads a file with no digest yet as missing, since its upload has not completed', async () => {
    const reader = createSideFileReader(files, 'chars/hero.gltf', () => undefined);
    expect(await reader.readSideFile('hero.bin')).toBeNull();
    expect(reader.requested).toEqual({ 'hero.bin': null });
  });

  it('reads from the upload root for an asset at the top level', async () => {
    const reader = createSideFileReader(path.join(files, 'chars'), 'hero.gltf', () => 'b'.repeat(64));
    expect(text(await reader.readSideFile('hero.bin'))).toBe('hero buffer');
  });
});

import { mkdir, mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { lintAsset } from '$lib/lint/lint-asset';
import { parsePolicy } from '$lib/lint/policy';
import {
  DRIFTING_CHANNEL,
  FLIPPED_CUBIC_CHANNEL,
  createRotationDocument,
  writeGlb
} from '../../../cli/testing/rotation-assets';
import { readReusableFileBytes } from './reusable-file-bytes';

let folder: string;

/** Bytes that differ from file to file, so a stale or shared buffer shows. */
function pattern(length: number, seed: number): Uint8Array {
  const bytes = new Uint8Array(length);
  for (let i = 0; i < length; i++) bytes[i] = (i * 31 + seed) & 0xff;
  return bytes;
}

beforeAll(async () => {
  folder = await mkdtemp(join(tmpdir(), 'orientry-reusable-bytes-'));
  await writeFile(join(folder, 'empty.bin'), new Uint8Array(0));
  await writeFile(join(folder, 'small.bin'), pattern(100, 1));
  await writeFile(join(folder, 'large.bin'), pattern(3 * 2 ** 20 + 5, 2));
  await mkdir(join(folder, 'a-folder'));
});
afterAll(async () => {
  await rm(folder, { recursive: true, force: true });
});

describe('readReusableFileBytes', () => {
  it('reads every byte, as Node readFile does, into a plain Uint8Array', async () => {
    for (const name of ['empty.bin', 'small.bin', 'large.bin']) {
      const file = await readReusableFileBytes(join(folder, name));
      // Node's fs.readFile is the oracle here.
      expect(Buffer.from(file.bytes).equals(await readFile(join(folder, name)))).toBe(true);
      expect(Buffer.isBuffer(file.bytes)).toBe(false);
      expect(file.bytes.byteOffset).toBe(0);
      file.release();
    }
  });

  it('hands a released buffer to the next file that fits, and never one still in use', async () => {
    const first = await readReusableFileBytes(join(folder, 'small.bin'));
    const held = await readReusableFileBytes(join(folder, 'small.bin'));
    expect(held.bytes.buffer).not.toBe(first.bytes.buffer);
    first.release();
    // Releasing twice must not put the buffer in the pool twice (two readers would then share it).
    first.release();
    const next = await readReusableFileBytes(join(folder, 'small.bin'));
    const other = await readReusableFileBytes(join(folder, 'small.bin'));
    expect(next.bytes.buffer).toBe(first.bytes.buffer);
    expect(other.bytes.buffer).not.toBe(first.bytes.buffer);
    expect(Buffer.from(next.bytes).equals(Buffer.from(pattern(100, 1)))).toBe(true);
    for (const file of [held, next, other]) file.release();
  });

  it('throws the file system error for a missing file or a folder, and keeps working after it', async () => {
    await expect(readReusableFileBytes(join(folder, 'missing.bin'))).rejects.toMatchObject({ code: 'ENOENT' });
    await expect(readReusableFileBytes(join(folder, 'a-folder'))).rejects.toMatchObject({ code: 'EISDIR' });
    const file = await readReusableFileBytes(join(folder, 'large.bin'));
    expect(file.bytes.length).toBe(3 * 2 ** 20 + 5);
    file.release();
  });

  it('leaves no view of the bytes in a lint report, so reusing the buffer cannot change a report', async () => {
    const policy = parsePolicy({});
    const drifting = join(folder, 'drifting.glb');
    const flipped = join(folder, 'flipped.glb');
    await writeGlb(createRotationDocument([DRIFTING_CHANNEL]), drifting);
    await writeGlb(createRotationDocument([FLIPPED_CUBIC_CHANNEL, DRIFTING_CHANNEL]), flipped);
    const lintWithReuse = async (path: string) => {
      const file = await readReusableFileBytes(path);
      try {
        return await lintAsset({ path: 'a.glb', bytes: file.bytes, readSideFile: async () => null }, policy);
      } finally {
        file.release();
      }
    };
    const first = await lintWithReuse(drifting);
    const firstCopy = structuredClone(first);
    // The second lint reads another file into the same buffer.
    await lintWithReuse(flipped);
    expect(first).toEqual(firstCopy);
    const fresh = await lintAsset(
      { path: 'a.glb', bytes: new Uint8Array(await readFile(drifting)), readSideFile: async () => null },
      policy
    );
    expect(first).toEqual(fresh);
    expect(first.findings.length).toBeGreaterThan(0);
  });
});

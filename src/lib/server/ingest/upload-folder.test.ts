import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { sweepStaleUploads, uploadsRootOf, withUploadFolder } from './upload-folder';

let dataDir: string;

beforeEach(() => {
  dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'orientry-uploads-'));
});
afterEach(() => fs.rmSync(dataDir, { recursive: true, force: true }));

/** A process id that is not running: above the Linux default pid_max of 4194304 (common practice). */
const DEAD_PID = 4_194_999;

describe('withUploadFolder', () => {
  it('gives an empty folder under uploads/ and removes it afterwards', async () => {
    let seen = '';
    const result = await withUploadFolder(dataDir, async (folder) => {
      seen = folder;
      expect(path.dirname(folder)).toBe(uploadsRootOf(dataDir));
      expect(fs.readdirSync(folder)).toEqual([]);
      fs.writeFileSync(path.join(folder, 'part.glb'), 'x');
      return 42;
    });
    expect(result).toBe(42);
    expect(fs.existsSync(seen)).toBe(false);
  });

  it('removes the folder when the work throws', async () => {
    let seen = '';
    await expect(
      withUploadFolder(dataDir, async (folder) => {
        seen = folder;
        fs.mkdirSync(path.join(folder, 'deep', 'er'), { recursive: true });
        throw new Error('lint failed');
      })
    ).rejects.toThrow('lint failed');
    expect(fs.existsSync(seen)).toBe(false);
  });
});

describe('sweepStaleUploads', () => {
  it('removes folders of dead processes and keeps those of live ones and unknown names', async () => {
    const root = uploadsRootOf(dataDir);
    const dead = `${DEAD_PID}-0123456789abcdef`;
    const live = `${process.pid}-0123456789abcdef`;
    for (const name of [dead, live, 'keep-me']) fs.mkdirSync(path.join(root, name), { recursive: true });
    expect(await sweepStaleUploads(root)).toEqual([dead]);
    expect(fs.readdirSync(root).sort()).toEqual(['keep-me', live].sort());
  });

  it('removes a live process folder once it is older than a day', async () => {
    const root = uploadsRootOf(dataDir);
    const live = `${process.pid}-fedcba9876543210`;
    fs.mkdirSync(path.join(root, live), { recursive: true });
    const twoDaysLater = Date.now() + 2 * 24 * 60 * 60 * 1000;
    expect(await sweepStaleUploads(root, twoDaysLater)).toEqual([live]);
  });

  it('does nothing when there is no uploads folder yet', async () => {
    expect(await sweepStaleUploads(path.join(dataDir, 'nowhere'))).toEqual([]);
  });
});

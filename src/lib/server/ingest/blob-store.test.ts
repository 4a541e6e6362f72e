import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { blobPathOf, readBlob, storeBlob } from './blob-store';

let dataDir: string;
beforeEach(() => {
  dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'orientry-blobs-'));
});
afterEach(() => fs.rmSync(dataDir, { recursive: true, force: true }));

const sha256 = (text: string) => crypto.createHash('sha256').update(text).digest('hex');

describe('blob store', () => {
  it('places a blob under blobs/<first two hex digits>/<the rest>', () => {
    const id = sha256('hero');
    expect(blobPathOf(dataDir, id)).toBe(path.join(dataDir, 'blobs', id.slice(0, 2), id.slice(2)));
    expect(() => blobPathOf(dataDir, '../../etc/passwd')).toThrow('64 lowercase hex digits');
  });

  it('stores a file once and reads it back by its digest', async () => {
    const id = sha256('hero buffer');
    const first = path.join(dataDir, 'first.bin');
    fs.writeFileSync(first, 'hero buffer');
    await storeBlob(dataDir, id, first);
    expect(Buffer.from((await readBlob(dataDir, id))!).toString()).toBe('hero buffer');

    const second = path.join(dataDir, 'second.bin');
    fs.writeFileSync(second, 'hero buffer');
    await storeBlob(dataDir, id, second);
    expect(fs.readdirSync(path.join(dataDir, 'blobs', id.slice(0, 2)))).toEqual([id.slice(2)]);
  });

  it('stores the same content sent under several paths once, when the moves run side by side', async () => {
    // A build may carry one file under several names; ingestion moves its blobs concurrently.
    const id = sha256('shared rig buffer');
    const sources = Array.from({ length: 8 }, (_, index) => path.join(dataDir, `copy-${index}.bin`));
    for (const source of sources) fs.writeFileSync(source, 'shared rig buffer');
    await Promise.all(sources.map((source) => storeBlob(dataDir, id, source)));
    expect(fs.readdirSync(path.join(dataDir, 'blobs', id.slice(0, 2)))).toEqual([id.slice(2)]);
    expect(Buffer.from((await readBlob(dataDir, id))!).toString()).toBe('shared rig buffer');
  });

  it('reads null for a blob never stored', async () => {
    expect(await readBlob(dataDir, sha256('nothing'))).toBeNull();
  });
});

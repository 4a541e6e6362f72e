/**
 * The data folder's disk full or read-only. The server's whole data folder (database, uploads,
 * blobs) lives on a 32 MiB tmpfs mounted for this test (mount(8), as root). Full: a filler file
 * takes all but a few KiB (or all of it, so the database cannot grow either), and a submission is
 * refused with 507 `storage.full`. Read-only: the uploads folder, then the blobs folder, is
 * replaced by a read-only bind mount of itself (the database stays writable, as a read-only
 * blob volume would leave it), and a submission is refused with 503 `storage.read-only`. Each
 * message says what to do. Builds stored before read back identically throughout (report export
 * and blob bytes), and once the disk has room or is writable again, the next submission is stored.
 *
 * Where mounting is not allowed (not root, or no tmpfs), the file is skipped and says so; the
 * mapping from storage error codes to answers is also unit-tested in storage-error.test.ts.
 */
import { execFileSync } from 'node:child_process';
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Build } from '$lib/server/db/models';
import { diverGlb } from './api-fixtures';
import { postBuild, seedProject, startApiTestServer, type ApiTestServer, type UploadFile } from './api-test-server';

const DISK_BYTES = 32 * 1024 * 1024;

/** Mounts a tmpfs of DISK_BYTES at a fresh folder, or returns null with the reason it cannot. */
function mountTinyDisk(): { mountPoint: string } | { reason: string } {
  const mountPoint = fs.mkdtempSync(path.join(os.tmpdir(), 'orientry-disk-'));
  try {
    execFileSync('mount', ['-t', 'tmpfs', '-o', `size=${DISK_BYTES}`, 'tmpfs', mountPoint], { stdio: 'pipe' });
    return { mountPoint };
  } catch (error) {
    fs.rmSync(mountPoint, { recursive: true, force: true });
    return { reason: String((error as { stderr?: Buffer }).stderr ?? error).trim() };
  }
}

const disk = mountTinyDisk();
const mountPoint = 'mountPoint' in disk ? disk.mountPoint : null;
if (!mountPoint)
  console.warn(`fault-storage: skipped, a tmpfs cannot be mounted here (${(disk as { reason: string }).reason})`);

let server: ApiTestServer;
let secret: string;
let storedBuildId: number;
let storedReport: string;
let storedBlobs: Map<string, string>;

/** Every blob file under the data folder with the SHA-256 of its bytes. */
function hashBlobs(): Map<string, string> {
  const hashes = new Map<string, string>();
  const blobsRoot = path.join(server.dataDir, 'blobs');
  for (const prefix of fs.readdirSync(blobsRoot)) {
    for (const rest of fs.readdirSync(path.join(blobsRoot, prefix))) {
      const bytes = fs.readFileSync(path.join(blobsRoot, prefix, rest));
      hashes.set(prefix + rest, crypto.createHash('sha256').update(bytes).digest('hex'));
    }
  }
  return hashes;
}

async function exportReport(buildId: number): Promise<string> {
  const response = await fetch(`${server.url}/api/v1/projects/quay/builds/${buildId}/report.json`, {
    headers: { authorization: `Bearer ${secret}` }
  });
  expect(response.status).toBe(200);
  return response.text();
}

/** A build of `count` distinct diver GLBs plus a `padBytes` side file of random bytes. */
async function buildFiles(label: string, count: number, padBytes = 0): Promise<UploadFile[]> {
  const files: UploadFile[] = [];
  for (let index = 0; index < count; index++) {
    files.push({ path: `chars/${label}-${index}.glb`, bytes: await diverGlb({ jointName: `${label}_${index}` }) });
  }
  if (padBytes > 0) files.push({ path: `chars/${label}-texture.png`, bytes: crypto.randomBytes(padBytes) });
  return files;
}

/** Makes `folder` read-only by bind-mounting it read-only over itself; returns the undo. */
function bindReadOnly(folder: string): () => void {
  fs.mkdirSync(folder, { recursive: true });
  execFileSync('mount', ['--bind', folder, folder], { stdio: 'pipe' });
  execFileSync('mount', ['-o', 'remount,bind,ro', folder], { stdio: 'pipe' });
  return () => execFileSync('umount', [folder], { stdio: 'pipe' });
}

/** Asserts the answer is the storage refusal `status`/`code` and its message says what to do. */
async function expectStorageRefusal(response: Response, status: number, code: string): Promise<string> {
  const body = (await response.json()) as { error?: { code: string; message: string } };
  expect({ status: response.status, code: body.error?.code }).toEqual({ status, code });
  expect(body.error!.message).toMatch(/DATA_DIR/);
  return body.error!.message;
}

describe.skipIf(!mountPoint)('the data folder on a full or read-only disk', () => {
  beforeAll(async () => {
    const outerTmp = process.env.TMPDIR;
    process.env.TMPDIR = mountPoint!;
    try {
      server = await startApiTestServer();
    } finally {
      if (outerTmp === undefined) delete process.env.TMPDIR;
      else process.env.TMPDIR = outerTmp;
    }
    ({ secret } = await seedProject('quay'));
    const first = await postBuild(server, 'quay', secret, await buildFiles('first', 3, 64 * 1024));
    expect(first.status).toBe(201);
    storedBuildId = ((await first.json()) as { build: { id: number } }).build.id;
    storedReport = await exportReport(storedBuildId);
    storedBlobs = hashBlobs();
  }, 240_000);

  afterAll(async () => {
    await server?.remove();
    if (mountPoint) {
      execFileSync('umount', [mountPoint], { stdio: 'pipe' });
      fs.rmSync(mountPoint, { recursive: true, force: true });
    }
  });

  it('refuses a submission with 507 storage.full when the disk is full, and stores it once there is room', async () => {
    const filler = path.join(mountPoint!, 'filler.bin');
    const { bavail, bsize } = fs.statfsSync(mountPoint!);
    // Leave 16 KiB: the build below needs about 300 KiB.
    fs.writeFileSync(filler, Buffer.alloc(Math.max(0, bavail * bsize - 16 * 1024)));
    try {
      const refused = await postBuild(server, 'quay', secret, await buildFiles('full', 2, 300 * 1024));
      const message = await expectStorageRefusal(refused, 507, 'storage.full');
      expect(message).toMatch(/free space|larger disk/i);
      expect(await exportReport(storedBuildId)).toBe(storedReport);
      expect(new Map([...hashBlobs()].filter(([name]) => storedBlobs.has(name)))).toEqual(storedBlobs);
    } finally {
      fs.rmSync(filler, { force: true });
    }
    const stored = await postBuild(server, 'quay', secret, await buildFiles('after-full', 2, 300 * 1024));
    expect(stored.status).toBe(201);
    expect(await exportReport(storedBuildId)).toBe(storedReport);
  });

  it('refuses even a one-file build with 507 storage.full when not a byte is left, and stores it once there is room', async () => {
    const filler = path.join(mountPoint!, 'filler.bin');
    const { bavail, bsize } = fs.statfsSync(mountPoint!);
    fs.writeFileSync(filler, Buffer.alloc(Math.max(0, bavail * bsize)));
    try {
      const refused = await postBuild(server, 'quay', secret, await buildFiles('tiny', 1));
      await expectStorageRefusal(refused, 507, 'storage.full');
      expect(await exportReport(storedBuildId)).toBe(storedReport);
    } finally {
      fs.rmSync(filler, { force: true });
    }
    expect((await postBuild(server, 'quay', secret, await buildFiles('after-tiny', 1))).status).toBe(201);
  });

  it.each(['uploads', 'blobs'])(
    'refuses a submission with 503 storage.read-only when %s is read-only, and stores it once writable',
    async (folder) => {
      const buildsBefore = await Build.count();
      const undo = bindReadOnly(path.join(server.dataDir, folder));
      try {
        const refused = await postBuild(server, 'quay', secret, await buildFiles(`read-only-${folder}`, 2));
        const message = await expectStorageRefusal(refused, 503, 'storage.read-only');
        expect(message).toMatch(/writable/i);
        expect(await Build.count()).toBe(buildsBefore);
        expect(await exportReport(storedBuildId)).toBe(storedReport);
        expect(new Map([...hashBlobs()].filter(([name]) => storedBlobs.has(name)))).toEqual(storedBlobs);
      } finally {
        undo();
      }
      const stored = await postBuild(server, 'quay', secret, await buildFiles(`after-read-only-${folder}`, 2));
      expect(stored.status).toBe(201);
      expect(await exportReport(storedBuildId)).toBe(storedReport);
    }
  );

  it('stays up through it all', async () => {
    expect(server.child.exitCode).toBeNull();
    expect((await fetch(`${server.url}/api/health`)).status).toBe(200);
  });
});

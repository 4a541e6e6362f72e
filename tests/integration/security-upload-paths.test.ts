/**
 * An upload can never write outside the data folder. A real server runs with its data folder,
 * working folder and TMPDIR inside one fresh root; file parts arrive with hostile names (`..`,
 * absolute paths, drive letters, backslashes, NUL and other control characters, names too long
 * for the file system, RFC 5987 encoded names, Unicode look-alikes and normalization pairs). Every
 * name is refused with a 400, or stored under exactly the name sent, inside the build. Afterwards
 * the only new entries anywhere under the root are content-addressed blobs and the database's own
 * files, no upload folder is left, and no file named after a hostile name exists anywhere it aimed.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Asset } from '$lib/server/db/models';
import { diverGlb } from './api-fixtures';
import { listUploadFolders, seedProject, startApiTestServer, type ApiTestServer } from './api-test-server';
import { HOSTILE_UPLOAD_NAMES } from '../support/fuzz/bad-envelopes';
import { filePart, metaPart, rawMultipart, type RawPart } from '../support/fuzz/raw-multipart';

let root: string;
let server: ApiTestServer;
let secret: string;
let glb: Uint8Array;
let entriesBefore: Set<string>;
const answers: { name: string; status: number; code: string | null; buildId: number | null }[] = [];

/** Every file and folder under `folder`, relative to `root`. */
function listTree(folder: string, into = new Set<string>()): Set<string> {
  for (const entry of fs.readdirSync(folder, { withFileTypes: true })) {
    const full = path.join(folder, entry.name);
    into.add(path.relative(root, full));
    if (entry.isDirectory()) listTree(full, into);
  }
  return into;
}

/** Posts one build of raw parts and records the answer under `name`. */
async function post(name: string, parts: RawPart[]): Promise<void> {
  const boundary = `----orientry-paths-${answers.length}`;
  const response = await fetch(`${server.url}/api/v1/projects/quay/builds`, {
    method: 'POST',
    body: rawMultipart(
      [metaPart(JSON.stringify({ branch: 'main', label: `paths ${answers.length}` })), ...parts],
      boundary
    ),
    headers: {
      authorization: `Bearer ${secret}`,
      origin: server.url,
      'content-type': `multipart/form-data; boundary=${boundary}`
    }
  });
  const body = (await response.json()) as { build?: { id: number }; error?: { code: string } };
  answers.push({ name, status: response.status, code: body.error?.code ?? null, buildId: body.build?.id ?? null });
}

beforeAll(async () => {
  root = fs.mkdtempSync(path.join(os.tmpdir(), 'orientry-upload-jail-'));
  fs.mkdirSync(path.join(root, 'cwd'));
  const outerTmp = process.env.TMPDIR;
  // The server's data folder (made by mkdtemp under os.tmpdir()) and its own TMPDIR land in the root.
  process.env.TMPDIR = root;
  try {
    server = await startApiTestServer({}, { cwd: path.join(root, 'cwd') });
  } finally {
    if (outerTmp === undefined) delete process.env.TMPDIR;
    else process.env.TMPDIR = outerTmp;
  }
  expect(server.dataDir.startsWith(root + path.sep)).toBe(true);
  ({ secret } = await seedProject('quay'));
  glb = await diverGlb();
  // A first build, so the blob store and the database files exist before the snapshot.
  await post('chars/first.glb', [filePart('chars/first.glb', glb)]);
  entriesBefore = listTree(root);

  for (const name of HOSTILE_UPLOAD_NAMES) await post(name.toString('latin1'), [filePart(name, glb)]);
  // RFC 5987 / RFC 7578 §4.2 extended names, decoded by the parser before any check.
  for (const encoded of ['..%2F..%2Fescaped.glb', '%2Ftmp%2Fescaped.glb', 'chars%5C..%5C..%5Cescaped.glb']) {
    await post(`filename*=${encoded}`, [
      {
        headers: [`Content-Disposition: form-data; name="file"; filename*=UTF-8''${encoded}`],
        body: glb
      }
    ]);
  }
  // Two spellings of one name (NFC and NFD, Unicode Standard Annex #15) in one build.
  await post('café NFC + NFD', [filePart('props/caf\u00e9.glb', glb), filePart('props/cafe\u0301.glb', glb)]);
}, 240_000);

afterAll(async () => {
  await server?.remove();
  if (root) fs.rmSync(root, { recursive: true, force: true });
});

describe('file names of an upload', () => {
  it('are refused with a 400, or stored exactly as sent inside the build', async () => {
    const problems: string[] = [];
    for (const answer of answers) {
      if (answer.status === 400) {
        if (
          !['upload.path-invalid', 'upload.malformed', 'upload.path-conflict', 'upload.no-assets'].includes(
            answer.code ?? ''
          )
        ) {
          problems.push(`${JSON.stringify(answer.name)}: 400 with code ${answer.code}`);
        }
        continue;
      }
      if (answer.status !== 201) {
        problems.push(`${JSON.stringify(answer.name)}: status ${answer.status} (${answer.code})`);
        continue;
      }
      for (const asset of await Asset.findAll({ where: { buildId: answer.buildId! } })) {
        const segments = asset.path.split('/');
        if (
          asset.path.startsWith('/') ||
          segments.includes('..') ||
          segments.includes('.') ||
          asset.path.includes('\\')
        ) {
          problems.push(`${JSON.stringify(answer.name)}: stored as ${JSON.stringify(asset.path)}`);
        }
      }
    }
    expect(problems).toEqual([]);
  });

  it('refuses every name that climbs, is absolute, names a drive or share, or holds control characters', () => {
    const mustRefuse = [
      '../escaped.glb',
      '../../../../escaped.glb',
      'chars/../../escaped.glb',
      '/tmp/escaped.glb',
      '//server/share/escaped.glb',
      'C:/escaped.glb',
      'C:\\escaped.glb',
      '\\\\server\\share\\escaped.glb',
      '..\\escaped.glb',
      'escaped\u0001.glb',
      'esc\naped.glb',
      `${'x'.repeat(300)}.glb`,
      `${'a'.repeat(1100)}.glb`,
      'filename*=..%2F..%2Fescaped.glb',
      'filename*=%2Ftmp%2Fescaped.glb',
      'filename*=chars%5C..%5C..%5Cescaped.glb'
    ];
    for (const name of mustRefuse) {
      expect(answers.find((answer) => answer.name === name)?.status, JSON.stringify(name)).toBe(400);
    }
  });

  it('keeps both Unicode spellings of one name as two assets, neither merged nor lost', async () => {
    const answer = answers.find((candidate) => candidate.name === 'café NFC + NFD')!;
    expect(answer.status).toBe(201);
    const paths = (await Asset.findAll({ where: { buildId: answer.buildId! } })).map((asset) => asset.path).sort();
    expect(paths).toEqual(['props/caf\u00e9.glb', 'props/cafe\u0301.glb'].sort());
  });

  it('write nothing anywhere but blobs and the database files, and leave no upload folder', () => {
    const added = [...listTree(root)].filter((entry) => !entriesBefore.has(entry));
    const dataFolder = path.relative(root, server.dataDir);
    const allowed = (entry: string) =>
      entry.startsWith(path.join(dataFolder, 'blobs') + path.sep) ||
      /^api\.db(-wal|-shm|-journal)?$/.test(path.basename(entry));
    expect(added.filter((entry) => !allowed(entry))).toEqual([]);
    expect(listUploadFolders(server)).toEqual([]);
  });

  it('leave no file named after a hostile name anywhere it aimed', () => {
    const named = [...listTree(root)].filter((entry) => path.basename(entry).includes('escaped'));
    expect(named).toEqual([]);
    for (const folder of ['/', '/tmp', os.tmpdir(), path.dirname(root), process.cwd()]) {
      expect(fs.existsSync(path.join(folder, 'escaped.glb')), folder).toBe(false);
    }
  });
});

import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { ApiError } from './api-error';
import { INGEST_LIMIT_DEFAULTS, type IngestLimits } from './limits';
import { receiveUpload } from './receive-upload';

let folder: string;
beforeEach(() => {
  folder = fs.mkdtempSync(path.join(os.tmpdir(), 'orientry-receive-'));
});
afterEach(() => fs.rmSync(folder, { recursive: true, force: true }));

const META = JSON.stringify({ branch: 'main', commit: '3f2a9c1' });

/** A multipart request as Node's fetch would send it. */
function uploadRequest(parts: [string, string | Blob, string?][]): Request {
  const form = new FormData();
  for (const [name, value, filename] of parts) {
    if (typeof value === 'string') form.append(name, value);
    else form.append(name, value, filename);
  }
  return new Request('http://localhost/api/v1/projects/tidewatch/builds', { method: 'POST', body: form });
}

const file = (text: string) => new Blob([text]);
const sha256 = (text: string) => crypto.createHash('sha256').update(text).digest('hex');

async function failureOf(promise: Promise<unknown>): Promise<ApiError> {
  try {
    await promise;
  } catch (error) {
    expect(error).toBeInstanceOf(ApiError);
    return error as ApiError;
  }
  throw new Error('expected the upload to be refused');
}

describe('receiveUpload', () => {
  it('writes each file under its relative path, hashing and counting it, and returns the meta text', async () => {
    const request = uploadRequest([
      ['meta', META],
      ['file', file('{"asset":{"version":"2.0"}}'), 'chars/hero.gltf'],
      ['file', file('buffer bytes'), 'chars/hero.bin'],
      ['file', file('glb'), 'kelp.glb']
    ]);
    const upload = await receiveUpload(request, folder, INGEST_LIMIT_DEFAULTS);
    expect(upload.metaText).toBe(META);
    const byPath = Object.fromEntries(upload.files.map((f) => [f.path, f]));
    expect(Object.keys(byPath).sort()).toEqual(['chars/hero.bin', 'chars/hero.gltf', 'kelp.glb']);
    expect(byPath['chars/hero.bin']).toEqual({
      path: 'chars/hero.bin',
      diskPath: path.join(folder, 'chars', 'hero.bin'),
      byteLength: 12,
      sha256: sha256('buffer bytes')
    });
    expect(fs.readFileSync(path.join(folder, 'chars', 'hero.gltf'), 'utf8')).toBe('{"asset":{"version":"2.0"}}');
  });

  it('accepts meta sent as a file part', async () => {
    const request = uploadRequest([
      ['meta', new Blob([META], { type: 'application/json' }), 'meta.json'],
      ['file', file('glb'), 'kelp.glb']
    ]);
    expect((await receiveUpload(request, folder, INGEST_LIMIT_DEFAULTS)).metaText).toBe(META);
  });

  it('refuses a body that is not multipart', async () => {
    const request = new Request('http://localhost/x', {
      method: 'POST',
      body: META,
      headers: { 'content-type': 'application/json' }
    });
    const failure = await failureOf(receiveUpload(request, folder, INGEST_LIMIT_DEFAULTS));
    expect([failure.status, failure.code]).toEqual([400, 'upload.content-type']);
    expect(failure.message).toContain('application/json');
  });

  it.each([
    { parts: [['file', file('x'), 'a.glb']], code: 'upload.meta-missing', field: 'meta' },
    { parts: [['meta', META]], code: 'upload.file-missing', field: 'file' },
    {
      parts: [
        ['meta', META],
        ['file', file('x'), 'a.glb'],
        ['extra', 'y']
      ],
      code: 'upload.unexpected-field',
      field: 'extra'
    },
    {
      parts: [
        ['meta', META],
        ['files', file('x'), 'a.glb']
      ],
      code: 'upload.unexpected-field',
      field: 'files'
    },
    {
      parts: [
        ['meta', META],
        ['meta', META],
        ['file', file('x'), 'a.glb']
      ],
      code: 'upload.meta-duplicate',
      field: 'meta'
    },
    {
      parts: [
        ['meta', META],
        ['file', file('x'), 'a.glb'],
        ['file', file('y'), 'a.glb']
      ],
      code: 'upload.duplicate-path',
      field: 'a.glb'
    },
    {
      parts: [
        ['meta', META],
        ['file', file('x'), 'chars'],
        ['file', file('y'), 'chars/a.glb']
      ],
      code: 'upload.path-conflict',
      // Either of the two clashing files may be named, whichever reached the disk second.
      field: 'chars'
    },
    {
      parts: [
        ['meta', META],
        ['file', file('x'), '../escape.glb']
      ],
      code: 'upload.path-invalid',
      field: '../escape.glb'
    },
    {
      parts: [
        ['meta', META],
        ['file', file('x'), '/abs.glb']
      ],
      code: 'upload.path-invalid',
      field: '/abs.glb'
    }
  ] as { parts: [string, string | Blob, string?][]; code: string; field: string }[])(
    'answers 400 $code naming $field',
    async ({ parts, code, field }) => {
      const failure = await failureOf(receiveUpload(uploadRequest(parts), folder, INGEST_LIMIT_DEFAULTS));
      expect([failure.status, failure.code]).toEqual([400, code]);
      expect(failure.message).toContain(field);
      expect(fs.existsSync(path.join(path.dirname(folder), 'escape.glb'))).toBe(false);
    }
  );

  const small: IngestLimits = { maxFileBytes: 1000, maxFiles: 3, maxBuildBytes: 2500, maxMetaBytes: 200 };

  it.each([
    {
      what: 'a file over the per-file limit',
      parts: [
        ['meta', META],
        ['file', file('x'.repeat(1001)), 'big.glb']
      ],
      code: 'limit.file-bytes',
      names: ['big.glb', 'ORIENTRY_MAX_FILE_BYTES', '1000']
    },
    {
      what: 'more files than allowed',
      parts: [['meta', META], ...['a', 'b', 'c', 'd'].map((n) => ['file', file('x'), `${n}.glb`])],
      code: 'limit.files',
      names: ['d.glb', 'ORIENTRY_MAX_FILES', '3']
    },
    {
      what: 'files adding up past the build limit',
      parts: [['meta', META], ...['a', 'b', 'c'].map((n) => ['file', file('x'.repeat(900)), `${n}.glb`])],
      code: 'limit.build-bytes',
      names: ['c.glb', 'ORIENTRY_MAX_BUILD_BYTES', '2500']
    },
    {
      what: 'a meta field over the meta limit',
      parts: [
        ['meta', JSON.stringify({ branch: 'x'.repeat(300) })],
        ['file', file('x'), 'a.glb']
      ],
      code: 'limit.meta-bytes',
      names: ['meta', 'ORIENTRY_MAX_META_BYTES', '200']
    },
    {
      what: 'a meta file part over the meta limit',
      parts: [
        ['meta', new Blob(['{' + ' '.repeat(300) + '}']), 'meta.json'],
        ['file', file('x'), 'a.glb']
      ],
      code: 'limit.meta-bytes',
      names: ['ORIENTRY_MAX_META_BYTES']
    }
  ] as { what: string; parts: [string, string | Blob, string?][]; code: string; names: string[] }[])(
    'answers 413 for $what, naming the limit',
    async ({ parts, code, names }) => {
      const failure = await failureOf(receiveUpload(uploadRequest(parts), folder, small));
      expect([failure.status, failure.code]).toEqual([413, code]);
      for (const name of names) expect(failure.message).toContain(name);
    }
  );

  it.each([
    { what: 'a file being written', fileName: 'chars/kelp.glb' },
    { what: 'a file already refused for its name', fileName: '../kelp.glb' }
  ])('answers 400 for a body cut off inside $what, and the cut stream errs into no void', async ({ fileName }) => {
    // No closing boundary (RFC 7578 §4.1): the parser and the part's own stream both fail.
    const body =
      `--cut\r\nContent-Disposition: form-data; name="meta"\r\n\r\n${META}\r\n` +
      `--cut\r\nContent-Disposition: form-data; name="file"; filename="${fileName}"\r\n\r\nglb bytes`;
    const request = new Request('http://localhost/x', {
      method: 'POST',
      body,
      headers: { 'content-type': 'multipart/form-data; boundary=cut' }
    });
    const failure = await failureOf(receiveUpload(request, folder, INGEST_LIMIT_DEFAULTS));
    expect(failure.status).toBe(400);
    expect(['upload.malformed', 'upload.path-invalid']).toContain(failure.code);
  });

  it('answers the per-file limit, not a malformed body, for an oversized file after a received one', async () => {
    // The meter's refusal also reaches the part's stream and the parser; it must stay a 413.
    const parts: [string, string | Blob, string?][] = [
      ['meta', META],
      ['file', file('x'.repeat(900)), 'a.glb'],
      ['file', file('x'.repeat(1001)), 'textures/huge.png']
    ];
    const failure = await failureOf(receiveUpload(uploadRequest(parts), folder, small));
    expect([failure.status, failure.code]).toEqual([413, 'limit.file-bytes']);
    expect(failure.message).toContain('textures/huge.png');
  });

  it('reports each file as soon as it is received, with its digest, before the upload ends', async () => {
    const parts: [string, string | Blob, string?][] = [
      ['meta', META],
      ['file', file('first'), 'a.glb'],
      ['file', file('second'), 'b/c.bin']
    ];
    const received: { path: string; sha256: string; isUploadDone: boolean }[] = [];
    let isUploadDone = false;
    const upload = receiveUpload(uploadRequest(parts), folder, small, {
      onFileReceived: (file) => received.push({ path: file.path, sha256: file.sha256, isUploadDone })
    });
    await upload;
    isUploadDone = true;
    // Parts are written side by side, so they may finish in either order.
    received.sort((a, b) => a.path.localeCompare(b.path));
    expect(received).toEqual([
      { path: 'a.glb', sha256: sha256('first'), isUploadDone: false },
      { path: 'b/c.bin', sha256: sha256('second'), isUploadDone: false }
    ]);
  });

  it('accepts files exactly at the per-file and build limits', async () => {
    const parts: [string, string | Blob, string?][] = [
      ['meta', META],
      ['file', file('x'.repeat(1000)), 'a.glb'],
      ['file', file('x'.repeat(1000)), 'b.glb'],
      ['file', file('x'.repeat(500)), 'c.glb']
    ];
    const upload = await receiveUpload(uploadRequest(parts), folder, small);
    expect(upload.files.reduce((sum, f) => sum + f.byteLength, 0)).toBe(2500);
  });
});

/**
 * The `Idempotency-Key` header of a build upload through the real server: a stored key is
 * answered before the body is read, the header agrees with the key in meta or the upload is
 * refused, and a header alone keys a new build. Also the key the server derives when meta asks
 * for one (`deriveIdempotencyKey: true`, what `orientry submit` sends without a key).
 */
import crypto from 'node:crypto';
import http from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Build } from '$lib/server/db/models';
import { diverGlb } from './api-fixtures';
import {
  countBuildRows,
  listUploadFolders,
  postBuild,
  seedProject,
  startApiTestServer,
  type ApiTestServer,
  type UploadFile,
  type BuildAnswer
} from './api-test-server';

let server: ApiTestServer;
let secret: string;
let otherSecret: string;
let projectId: number;
let files: UploadFile[];

beforeAll(async () => {
  server = await startApiTestServer();
  const seeded = await seedProject('tidewatch');
  secret = seeded.secret;
  projectId = seeded.project.id;
  ({ secret: otherSecret } = await seedProject('harbour-props'));
  files = [{ path: 'chars/kelp-diver.glb', bytes: await diverGlb() }];
});
afterAll(async () => server?.remove());

/** Posts `files` with the header and meta keys given (null leaves one out). */
async function submit(
  headerKey: string | null,
  metaKey: string | null,
  options: { slug?: string; token?: string } = {}
): Promise<Response> {
  return postBuild(
    server,
    options.slug ?? 'tidewatch',
    options.token ?? secret,
    files,
    { branch: 'main', ...(metaKey === null ? {} : { idempotencyKey: metaKey }) },
    { headers: headerKey === null ? {} : { 'idempotency-key': headerKey } }
  );
}

/**
 * Sends the head of an upload and the first bytes of its body, then waits for an answer without
 * ever sending the rest: only a server that answers before reading the body answers at all.
 */
async function postHeadOnly(headerKey: string): Promise<{ status: number; body: string }> {
  const boundary = '----orientry-early-answer';
  const url = new URL(`${server.url}/api/v1/projects/tidewatch/builds`);
  return new Promise((resolve, reject) => {
    const request = http.request({
      host: url.hostname,
      port: url.port,
      path: url.pathname,
      method: 'POST',
      headers: {
        authorization: `Bearer ${secret}`,
        origin: server.url,
        'idempotency-key': headerKey,
        'content-type': `multipart/form-data; boundary=${boundary}`,
        'content-length': String(50 * 1024 * 1024)
      }
    });
    const timer = setTimeout(() => {
      request.destroy();
      reject(new Error('No answer within 10 s: the server waited for the body.'));
    }, 10_000);
    request.on('error', (error) => {
      clearTimeout(timer);
      reject(error);
    });
    request.on('response', (response) => {
      let body = '';
      response.setEncoding('utf8');
      response.on('data', (text: string) => (body += text));
      response.on('end', () => {
        clearTimeout(timer);
        request.destroy();
        resolve({ status: response.statusCode!, body });
      });
    });
    request.write(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="chars/huge.glb"\r\n\r\n`);
    request.write(Buffer.alloc(64 * 1024, 7));
  });
}

/**
 * Posts `body` in full with Node's http client, which (unlike fetch) keeps writing after an early
 * answer. Resolves once the answer has arrived and the body is written, or after 15 s.
 */
async function sendWhole(
  body: Buffer,
  headers: Record<string, string>
): Promise<{ status: number; buildId: number; isBodyWritten: boolean }> {
  const url = new URL(`${server.url}/api/v1/projects/tidewatch/builds`);
  return new Promise((resolve, reject) => {
    const request = http.request({ host: url.hostname, port: url.port, path: url.pathname, method: 'POST', headers });
    let answer: { status: number; buildId: number } | null = null;
    let isBodyWritten = false;
    const settle = () => {
      if (answer && isBodyWritten) {
        clearTimeout(timer);
        resolve({ ...answer, isBodyWritten });
      }
    };
    const timer = setTimeout(() => {
      request.destroy();
      if (answer) resolve({ ...answer, isBodyWritten });
      else reject(new Error('No answer within 15 s.'));
    }, 15_000);
    request.on('error', (error) => {
      clearTimeout(timer);
      reject(error);
    });
    request.on('finish', () => {
      isBodyWritten = true;
      settle();
    });
    request.on('response', (response) => {
      let text = '';
      response.setEncoding('utf8');
      response.on('data', (chunk: string) => (text += chunk));
      response.on('end', () => {
        answer = { status: response.statusCode!, buildId: (JSON.parse(text) as BuildAnswer).build.id };
        settle();
      });
    });
    request.end(body);
  });
}

describe('Idempotency-Key header', () => {
  let storedId: number;

  it('stores a new build under the key from meta when the header agrees', async () => {
    const response = await submit('ci-job-5101', 'ci-job-5101');
    expect(response.status).toBe(201);
    storedId = ((await response.json()) as BuildAnswer).build.id;
    expect((await Build.findByPk(storedId))?.idempotencyKey).toBe('ci-job-5101');
  });

  it('answers 200 with the stored build before the body is read', async () => {
    const before = await countBuildRows(server.database);
    const answer = await postHeadOnly('ci-job-5101');
    expect(answer.status).toBe(200);
    expect((JSON.parse(answer.body) as BuildAnswer).build.id).toBe(storedId);
    expect(await countBuildRows(server.database)).toEqual(before);
  });

  it('reads and drops the rest of the body, so a client that keeps sending after the answer finishes cleanly', async () => {
    const boundary = '----orientry-keep-sending';
    // Far more than socket buffers hold, so the client can finish writing only if the server reads on.
    const body = Buffer.concat([
      Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="chars/big.glb"\r\n\r\n`),
      Buffer.alloc(32 * 1024 * 1024, 3),
      Buffer.from(`\r\n--${boundary}--\r\n`)
    ]);
    const answer = await sendWhole(body, {
      authorization: `Bearer ${secret}`,
      origin: server.url,
      'idempotency-key': 'ci-job-5101',
      'content-type': `multipart/form-data; boundary=${boundary}`
    });
    expect(answer).toEqual({ status: 200, buildId: storedId, isBodyWritten: true });
  });

  it('answers a repeated whole upload from the header alone, the same as from meta', async () => {
    const before = await countBuildRows(server.database);
    const response = await submit('ci-job-5101', null);
    expect(response.status).toBe(200);
    expect(((await response.json()) as BuildAnswer).build.id).toBe(storedId);
    expect(await countBuildRows(server.database)).toEqual(before);
    expect(listUploadFolders(server)).toEqual([]);
  });

  it('refuses 400 upload.idempotency-mismatch when the header and meta name different keys, storing nothing', async () => {
    const before = await countBuildRows(server.database);
    const response = await submit('ci-job-5102', 'ci-job-5103');
    expect(response.status).toBe(400);
    const { error } = (await response.json()) as { error: { code: string; message: string } };
    expect(error.code).toBe('upload.idempotency-mismatch');
    expect(error.message).toContain('"ci-job-5102"');
    expect(error.message).toContain('"ci-job-5103"');
    expect(await countBuildRows(server.database)).toEqual(before);
    expect(listUploadFolders(server)).toEqual([]);
  });

  it('answers a stored header key even when meta names another key, since the body is never read', async () => {
    const response = await submit('ci-job-5101', 'ci-job-5104');
    expect(response.status).toBe(200);
    expect(((await response.json()) as BuildAnswer).build.id).toBe(storedId);
  });

  it('stores a new build under the header key when meta has none, and answers it on the next upload', async () => {
    const first = await submit('ci-job-5105', null);
    expect(first.status).toBe(201);
    const { id } = ((await first.json()) as BuildAnswer).build;
    expect((await Build.findByPk(id))?.idempotencyKey).toBe('ci-job-5105');
    const again = await submit(null, 'ci-job-5105');
    expect(again.status).toBe(200);
    expect(((await again.json()) as BuildAnswer).build.id).toBe(id);
  });

  it('matches keys within one project only', async () => {
    const response = await submit('ci-job-5101', null, { slug: 'harbour-props', token: otherSecret });
    expect(response.status).toBe(201);
    expect(((await response.json()) as BuildAnswer).build.id).not.toBe(storedId);
    expect(await Build.count({ where: { projectId, idempotencyKey: 'ci-job-5101' } })).toBe(1);
  });

  it.each([
    { name: 'empty', value: '  ', reason: 'must not be empty' },
    { name: 'too long', value: 'k'.repeat(201), reason: 'at most 200 characters' }
  ])('refuses an $name header with 400 upload.idempotency-key-invalid', async ({ value, reason }) => {
    const before = await countBuildRows(server.database);
    const response = await submit(value, null);
    expect(response.status).toBe(400);
    const { error } = (await response.json()) as { error: { code: string; message: string } };
    expect(error.code).toBe('upload.idempotency-key-invalid');
    expect(error.message).toContain('Idempotency-Key');
    expect(error.message).toContain(reason);
    expect(await countBuildRows(server.database)).toEqual(before);
  });
});

describe('a key derived by the server (meta.deriveIdempotencyKey)', () => {
  const sha256 = (bytes: Uint8Array | string) => crypto.createHash('sha256').update(bytes).digest('hex');
  const details = { branch: 'feature/kelp-diver', commit: '5e1f0c2a', label: '#77', deriveIdempotencyKey: true };
  let derivedId: number;

  it("keys the build by the details and each file's path and SHA-256, as the CLI once did", async () => {
    const response = await postBuild(server, 'tidewatch', secret, files, details);
    expect(response.status).toBe(201);
    derivedId = ((await response.json()) as BuildAnswer).build.id;
    // The documented canonical form (derived-idempotency-key.ts), hashed with Node's SHA-256 (FIPS 180-4).
    const canonical = JSON.stringify([
      'orientry-submit-v1',
      'tidewatch',
      'feature/kelp-diver',
      '5e1f0c2a',
      '#77',
      files.map((file) => [file.path, sha256(file.bytes)])
    ]);
    expect((await Build.findByPk(derivedId))?.idempotencyKey).toBe(`cli1-${sha256(canonical)}`);
  });

  it('answers the same upload again with the stored build, storing nothing new', async () => {
    const before = await countBuildRows(server.database);
    const response = await postBuild(server, 'tidewatch', secret, files, details);
    expect(response.status).toBe(200);
    expect(((await response.json()) as BuildAnswer).build.id).toBe(derivedId);
    expect(await countBuildRows(server.database)).toEqual(before);
    expect(listUploadFolders(server)).toEqual([]);
  });

  it('stores a new build when a file changed', async () => {
    const changed = [{ ...files[0], bytes: Buffer.concat([Buffer.from(files[0].bytes), Buffer.alloc(4)]) }];
    const response = await postBuild(server, 'tidewatch', secret, changed, details);
    expect(response.status).toBe(201);
    expect(((await response.json()) as BuildAnswer).build.id).not.toBe(derivedId);
  });

  it('uses a key that meta names instead of deriving one', async () => {
    const response = await postBuild(server, 'tidewatch', secret, files, { ...details, idempotencyKey: 'ci-job-5200' });
    expect(response.status).toBe(201);
    const { id } = ((await response.json()) as BuildAnswer).build;
    expect((await Build.findByPk(id))?.idempotencyKey).toBe('ci-job-5200');
  });

  it('stores every upload as a new build when meta neither names nor asks for a key', async () => {
    const { deriveIdempotencyKey: _asked, ...plain } = details;
    const first = await postBuild(server, 'tidewatch', secret, files, plain);
    const second = await postBuild(server, 'tidewatch', secret, files, plain);
    expect([first.status, second.status]).toEqual([201, 201]);
    const ids = await Promise.all(
      [first, second].map(async (response) => ((await response.json()) as BuildAnswer).build.id)
    );
    expect(ids[1]).not.toBe(ids[0]);
    expect((await Build.findByPk(ids[0]))?.idempotencyKey).toBeNull();
  });
});

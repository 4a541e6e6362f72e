/**
 * Every way a build upload is refused, through the real server with small limits: the status,
 * the error code, a message naming what was wrong, and proof that nothing was stored.
 */
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { ApiToken } from '$lib/server/db/models';
import { diverGlb } from './api-fixtures';
import {
  countBuildRows,
  listUploadFolders,
  postBuild,
  seedProject,
  startApiTestServer,
  type ApiTestServer,
  type UploadFile
} from './api-test-server';

let server: ApiTestServer;
let secret: string;
let otherSecret: string;
let revokedSecret: string;
let glb: Uint8Array;

// Small limits so each is reached with a few kilobytes (the defaults are covered by unit tests).
const LIMITS = {
  ORIENTRY_MAX_FILE_BYTES: '64K',
  ORIENTRY_MAX_FILES: '4',
  ORIENTRY_MAX_BUILD_BYTES: '160K',
  ORIENTRY_MAX_META_BYTES: '1K'
};

beforeAll(async () => {
  server = await startApiTestServer(LIMITS);
  ({ secret } = await seedProject('tidewatch'));
  ({ secret: otherSecret } = await seedProject('harbour-props'));
  const revoked = await seedProject('lighthouse');
  revokedSecret = revoked.secret;
  await ApiToken.update({ revokedAt: new Date() }, { where: { id: revoked.tokenId } });
  glb = await diverGlb();
});
afterAll(async () => server?.remove());

let rowsBefore: Record<string, number>;
beforeEach(async () => {
  rowsBefore = await countBuildRows(server.database);
});

/** Checks an error answer and that the refused upload left no rows and no upload folder. */
async function expectRefused(response: Response, status: number, code: string, ...named: string[]): Promise<void> {
  const body = (await response.json()) as { error: { code: string; message: string } };
  expect({ status: response.status, code: body.error.code }).toEqual({ status, code });
  for (const text of named) expect(body.error.message).toContain(text);
  expect(await countBuildRows(server.database)).toEqual(rowsBefore);
  expect(listUploadFolders(server)).toEqual([]);
}

const asset = (): UploadFile[] => [{ path: 'chars/kelp-diver.glb', bytes: glb }];

/** A multipart body written byte by byte, for filenames a FormData would escape or refuse. */
function rawMultipart(
  parts: { name: string; filename?: string; filenameStar?: string; content: string | Uint8Array }[]
): {
  body: Buffer;
  contentType: string;
} {
  const boundary = '----orientry-test-boundary';
  const chunks: Buffer[] = [];
  for (const part of parts) {
    // RFC 6266 / RFC 8187: filename*=utf-8''<percent-encoded> carries bytes a quoted string cannot.
    const filename =
      part.filenameStar !== undefined
        ? `; filename*=utf-8''${part.filenameStar}`
        : part.filename === undefined
          ? ''
          : `; filename="${part.filename}"`;
    chunks.push(Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="${part.name}"${filename}\r\n\r\n`));
    chunks.push(Buffer.from(part.content));
    chunks.push(Buffer.from('\r\n'));
  }
  chunks.push(Buffer.from(`--${boundary}--\r\n`));
  return { body: Buffer.concat(chunks), contentType: `multipart/form-data; boundary=${boundary}` };
}

async function postRaw(
  body: Buffer | string,
  contentType: string,
  authorization = `Bearer ${secret}`
): Promise<Response> {
  return fetch(`${server.url}/api/v1/projects/tidewatch/builds`, {
    method: 'POST',
    body: typeof body === 'string' ? body : new Uint8Array(body),
    headers: { 'content-type': contentType, authorization, origin: server.url }
  });
}

describe('who may submit', () => {
  it('answers 404 for an unknown project', async () => {
    await expectRefused(
      await postBuild(server, 'no-such-project', secret, asset()),
      404,
      'project.not-found',
      'no-such-project'
    );
  });

  it.each([
    { label: 'no Authorization header', authorization: null, code: 'auth.token-missing' },
    { label: 'another scheme', authorization: 'Basic dXNlcjpwYXNz', code: 'auth.token-missing' },
    { label: 'a secret of the wrong shape', authorization: 'Bearer hunter2', code: 'auth.token-invalid' },
    {
      label: 'an unknown secret',
      authorization: `Bearer ort_${'A'.repeat(43)}`,
      code: 'auth.token-invalid'
    }
  ])('answers 401 for $label', async ({ authorization, code }) => {
    await expectRefused(await postBuild(server, 'tidewatch', secret, asset(), undefined, { authorization }), 401, code);
  });

  it('answers 403 for the token of another project', async () => {
    await expectRefused(
      await postBuild(server, 'tidewatch', otherSecret, asset()),
      403,
      'auth.token-wrong-project',
      'tidewatch'
    );
  });

  it('answers 403 for a revoked token', async () => {
    await expectRefused(await postBuild(server, 'lighthouse', revokedSecret, asset()), 403, 'auth.token-revoked');
  });

  it('checks the token before it looks at the body', async () => {
    await expectRefused(
      await postRaw('{"not":"multipart"}', 'application/json', 'Bearer nope'),
      401,
      'auth.token-invalid'
    );
  });

  it('answers a refused token even while a large body is still arriving', async () => {
    const big: UploadFile[] = [{ path: 'big.glb', bytes: new Uint8Array(4 * 1024 * 1024) }];
    await expectRefused(
      await postBuild(server, 'tidewatch', secret, big, undefined, { authorization: null }),
      401,
      'auth.token-missing'
    );
  });
});

describe('what a build must look like', () => {
  it('answers 400 for a body that is not multipart', async () => {
    await expectRefused(
      await postRaw('{"branch":"main"}', 'application/json'),
      400,
      'upload.content-type',
      'application/json'
    );
  });

  it('answers 400 naming meta when the meta part is missing', async () => {
    await expectRefused(
      await postBuild(server, 'tidewatch', secret, asset(), undefined, { omitMeta: true }),
      400,
      'upload.meta-missing',
      'meta'
    );
  });

  it('answers 400 naming file when no file is sent', async () => {
    await expectRefused(await postBuild(server, 'tidewatch', secret, []), 400, 'upload.file-missing', 'file');
  });

  it('answers 400 when only side files are sent', async () => {
    const files = [{ path: 'props/buoy.bin', bytes: 'bytes' }];
    await expectRefused(await postBuild(server, 'tidewatch', secret, files), 400, 'upload.no-assets', 'props/buoy.bin');
  });

  it.each([
    { label: 'meta that is not JSON', metaText: '{branch: main', named: 'not valid JSON' },
    { label: 'meta without a branch', metaText: '{"commit":"3f2a9c1"}', named: 'meta.branch' },
    { label: 'an empty branch', metaText: '{"branch":"  "}', named: 'meta.branch' },
    { label: 'a commit that is no commit id', metaText: '{"branch":"main","commit":"HEAD~1"}', named: 'meta.commit' },
    {
      label: 'a CI job URL that is no http URL',
      metaText: '{"branch":"main","ciJobUrl":"ftp://x"}',
      named: 'meta.ciJobUrl'
    },
    { label: 'an unknown meta field', metaText: '{"branch":"main","brnach":"x"}', named: 'brnach' }
  ])('answers 400 for $label', async ({ metaText, named }) => {
    await expectRefused(
      await postBuild(server, 'tidewatch', secret, asset(), undefined, { metaText }),
      400,
      'upload.meta-invalid',
      named
    );
  });

  it.each([
    { label: 'a parent segment', filename: 'chars/../../escape.glb', named: '".."' },
    { label: 'an absolute path', filename: '/srv/escape.glb', named: 'absolute' },
    { label: 'a backslash', filename: 'chars\\\\hero.glb', named: 'backslash' },
    { label: 'an empty segment', filename: 'chars//hero.glb', named: 'empty segment' },
    { label: 'a drive letter', filename: 'C:/assets/hero.glb', named: 'drive letter' }
  ])('answers 400 naming the file for $label', async ({ filename, named }) => {
    const { body, contentType } = rawMultipart([
      { name: 'meta', content: '{"branch":"main"}' },
      { name: 'file', filename, content: glb }
    ]);
    await expectRefused(await postRaw(body, contentType), 400, 'upload.path-invalid', named, 'file "');
  });

  it('answers 400 for a NUL character in a file name', async () => {
    const { body, contentType } = rawMultipart([
      { name: 'meta', content: '{"branch":"main"}' },
      { name: 'file', filenameStar: 'chars%2Fhero%00.glb', content: glb }
    ]);
    await expectRefused(await postRaw(body, contentType), 400, 'upload.path-invalid', 'NUL');
  });

  it('answers 400 for a raw NUL byte in a part header, which no parser accepts', async () => {
    const { body, contentType } = rawMultipart([
      { name: 'meta', content: '{"branch":"main"}' },
      { name: 'file', filename: 'chars/hero\u0000.glb', content: glb }
    ]);
    await expectRefused(await postRaw(body, contentType), 400, 'upload.malformed');
  });

  it('answers 400 for a path sent twice', async () => {
    const files = [...asset(), ...asset()];
    await expectRefused(
      await postBuild(server, 'tidewatch', secret, files),
      400,
      'upload.duplicate-path',
      'chars/kelp-diver.glb'
    );
  });

  it('answers 400 naming an unexpected form field', async () => {
    const { body, contentType } = rawMultipart([
      { name: 'meta', content: '{"branch":"main"}' },
      { name: 'policy', content: '{}' },
      { name: 'file', filename: 'hero.glb', content: glb }
    ]);
    await expectRefused(await postRaw(body, contentType), 400, 'upload.unexpected-field', 'policy');
  });
});

describe('limits', () => {
  const kib = (n: number) => new Uint8Array(n * 1024);

  it('answers 413 naming the per-file limit', async () => {
    const files = [...asset(), { path: 'textures/huge.png', bytes: kib(65) }];
    await expectRefused(
      await postBuild(server, 'tidewatch', secret, files),
      413,
      'limit.file-bytes',
      'textures/huge.png',
      'ORIENTRY_MAX_FILE_BYTES'
    );
  });

  it('answers 413 naming the file-count limit', async () => {
    const files = [...asset(), ...[1, 2, 3, 4].map((n) => ({ path: `side/${n}.bin`, bytes: 'x' }))];
    await expectRefused(await postBuild(server, 'tidewatch', secret, files), 413, 'limit.files', 'ORIENTRY_MAX_FILES');
  });

  it('answers 413 naming the build-size limit', async () => {
    const files = [...asset(), ...[1, 2, 3].map((n) => ({ path: `side/${n}.bin`, bytes: kib(60) }))];
    await expectRefused(
      await postBuild(server, 'tidewatch', secret, files),
      413,
      'limit.build-bytes',
      'ORIENTRY_MAX_BUILD_BYTES'
    );
  });

  it('answers 413 naming the meta limit', async () => {
    const metaText = JSON.stringify({ branch: 'main', label: 'x'.repeat(1100) });
    await expectRefused(
      await postBuild(server, 'tidewatch', secret, asset(), undefined, { metaText }),
      413,
      'limit.meta-bytes',
      'ORIENTRY_MAX_META_BYTES'
    );
  });

  it('accepts a build just inside every limit', async () => {
    const files = [...asset(), ...[1, 2].map((n) => ({ path: `side/${n}.bin`, bytes: kib(64) }))];
    const response = await postBuild(server, 'tidewatch', secret, files, { branch: 'main' });
    expect(response.status).toBe(201);
  });
});

describe('the framework in front of the route', () => {
  it('refuses a multipart post without an Origin header, so clients must send one', async () => {
    const form = new FormData();
    form.append('meta', '{"branch":"main"}');
    const response = await fetch(`${server.url}/api/v1/projects/tidewatch/builds`, {
      method: 'POST',
      body: form,
      headers: { authorization: `Bearer ${secret}` }
    });
    // SvelteKit's cross-site form check runs before any route (kit.csrf); see the API docs.
    expect(response.status).toBe(403);
    expect(await countBuildRows(server.database)).toEqual(rowsBefore);
  });
});

describe('a server started without BODY_SIZE_LIMIT', () => {
  let defaultServer: ApiTestServer;
  beforeAll(async () => {
    // adapter-node's own default is 512K; start scripts must raise it (see the API notes).
    defaultServer = await startApiTestServer({ BODY_SIZE_LIMIT: '512K' });
  });
  afterAll(async () => defaultServer?.remove());

  it('answers 413 naming BODY_SIZE_LIMIT for an upload over 512 KiB', async () => {
    // The models follow the database opened last, which is this server's.
    const { secret: tokenSecret } = await seedProject('tidewatch');
    const files = [...asset(), { path: 'textures/reef.png', bytes: new Uint8Array(600 * 1024) }];
    const response = await postBuild(defaultServer, 'tidewatch', tokenSecret, files);
    const body = (await response.json()) as { error: { code: string; message: string } };
    expect([response.status, body.error.code]).toEqual([413, 'limit.body-bytes']);
    expect(body.error.message).toContain('BODY_SIZE_LIMIT');
    expect(await countBuildRows(defaultServer.database)).toEqual({
      builds: 0,
      assets: 0,
      findings: 0,
      asset_side_files: 0
    });
  });
});

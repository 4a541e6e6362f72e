/**
 * GET /cli/orientry.js through the real server: the bundled CLI for anyone (no sign-in), with a
 * content-hash ETag, a short public cache and the product version; 404 naming the build command
 * when the bundle was never built.
 */
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { version } from '../../package.json';
import { buildCli, CLI_PATH } from '../../cli/testing/run-cli';
import { startApiTestServer, type ApiTestServer } from './api-test-server';

let server: ApiTestServer;

beforeAll(async () => {
  buildCli();
  server = await startApiTestServer();
}, 600_000);
afterAll(async () => server?.remove());

describe('GET /cli/orientry.js', () => {
  it('serves the bundle without sign-in as JavaScript, byte for byte', async () => {
    const response = await fetch(`${server.url}/cli/orientry.js`, { redirect: 'manual' });
    expect(response.status).toBe(200);
    expect(response.headers.get('content-type')).toBe('text/javascript; charset=utf-8');
    expect(response.headers.get('cache-control')).toBe('public, max-age=300');
    expect(response.headers.get('x-orientry-version')).toBe(version);
    const bytes = Buffer.from(await response.arrayBuffer());
    expect(bytes.equals(fs.readFileSync(CLI_PATH))).toBe(true);
    expect(bytes.subarray(0, 19).toString('utf8')).toBe('#!/usr/bin/env node');
  });

  it('tags the bundle with the SHA-256 of its content', async () => {
    const response = await fetch(`${server.url}/cli/orientry.js`);
    await response.arrayBuffer();
    // The tag is the file's SHA-256 (FIPS 180-4, computed here by node:crypto) in base64url.
    const digest = crypto.createHash('sha256').update(fs.readFileSync(CLI_PATH)).digest('base64url');
    expect(response.headers.get('etag')).toBe(`"sha256-${digest}"`);
  });

  it('answers 304 with no body to a client that holds the current bundle', async () => {
    const first = await fetch(`${server.url}/cli/orientry.js`);
    await first.arrayBuffer();
    const etag = first.headers.get('etag')!;
    for (const ifNoneMatch of [etag, `W/${etag}`, `"stale", ${etag}`]) {
      const again = await fetch(`${server.url}/cli/orientry.js`, { headers: { 'if-none-match': ifNoneMatch } });
      expect(again.status, ifNoneMatch).toBe(304);
      expect(again.headers.get('etag')).toBe(etag);
      expect(await again.text()).toBe('');
    }
  });

  it('sends the whole bundle again when the client holds another version', async () => {
    const response = await fetch(`${server.url}/cli/orientry.js`, { headers: { 'if-none-match': '"sha256-old"' } });
    expect(response.status).toBe(200);
    expect((await response.arrayBuffer()).byteLength).toBe(fs.statSync(CLI_PATH).size);
  });

  it('keeps the sign-in wall on the paths beside it', async () => {
    const response = await fetch(`${server.url}/cli/other.js`, { redirect: 'manual' });
    expect(response.status).toBe(303);
    expect(response.headers.get('location')).toBe('/signin?redirectTo=%2Fcli%2Fother.js');
  });
});

describe('GET /cli/orientry.js on a server without the bundle', () => {
  let bare: ApiTestServer;
  let emptyFolder: string;

  beforeAll(async () => {
    emptyFolder = fs.mkdtempSync(path.join(os.tmpdir(), 'orientry-no-cli-'));
    bare = await startApiTestServer({}, { cwd: emptyFolder });
  }, 600_000);
  afterAll(async () => {
    await bare?.remove();
    fs.rmSync(emptyFolder, { recursive: true, force: true });
  });

  it('answers 404 with a JSON error that says to run npm run build:cli', async () => {
    const response = await fetch(`${bare.url}/cli/orientry.js`);
    expect(response.status).toBe(404);
    expect(response.headers.get('content-type')).toContain('application/json');
    const body = (await response.json()) as { error: { code: string; message: string } };
    expect(body.error.code).toBe('cli.not-built');
    expect(body.error.message).toContain('npm run build:cli');
    expect(body.error.message).toContain('cli/dist/orientry.js');
  });
});

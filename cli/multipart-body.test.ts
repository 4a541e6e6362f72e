import { randomBytes } from 'node:crypto';
import { mkdtemp, rm, truncate, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import busboy from 'busboy';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CliError } from './cli-error';
import { createMultipartBody, type MultipartPart } from './multipart-body';

/** A part as busboy (the server's parser) hands it over. */
interface ParsedPart {
  name: string;
  fileName: string | null;
  mimeType: string;
  bytes: Buffer;
}

/** Streams `body` through busboy, as the server's upload receiver does, and collects every part. */
async function parseWithBusboy(body: AsyncIterable<Uint8Array>, contentType: string): Promise<ParsedPart[]> {
  const parts: ParsedPart[] = [];
  const parser = busboy({ headers: { 'content-type': contentType }, preservePath: true, defParamCharset: 'utf8' });
  const done = new Promise<void>((resolve, reject) => {
    parser.on('file', (name, file, info) => {
      const chunks: Buffer[] = [];
      file.on('data', (chunk: Buffer) => chunks.push(chunk));
      file.on('end', () =>
        parts.push({ name, fileName: info.filename ?? null, mimeType: info.mimeType, bytes: Buffer.concat(chunks) })
      );
    });
    parser.on('field', (name, value, info) =>
      parts.push({ name, fileName: null, mimeType: info.mimeType, bytes: Buffer.from(value, 'utf8') })
    );
    parser.on('close', resolve);
    parser.on('error', reject);
  });
  Readable.from(copies(body)).pipe(parser);
  await done;
  return parts;
}

/** Each chunk copied as it comes: the body reuses its read buffers (see MultipartBody.open). */
async function* copies(body: AsyncIterable<Uint8Array>): AsyncGenerator<Buffer> {
  for await (const chunk of body) yield Buffer.from(chunk);
}

async function readAll(body: AsyncIterable<Uint8Array>): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const chunk of copies(body)) chunks.push(chunk);
  return Buffer.concat(chunks);
}

let folder: string;
let bigBytes: Buffer;
let binBytes: Buffer;

beforeAll(async () => {
  folder = await mkdtemp(join(tmpdir(), 'orientry-multipart-'));
  // 1.5 MiB of random bytes: several read chunks, and surely containing CR, LF and dashes.
  bigBytes = randomBytes(1536 * 1024);
  binBytes = Buffer.from([0x0d, 0x0a, 0x2d, 0x2d, 0x00, 0xff]);
  await writeFile(join(folder, 'keeper.glb'), bigBytes);
  await writeFile(join(folder, 'lantern.bin'), binBytes);
  await writeFile(join(folder, 'empty.bin'), '');
});
afterAll(async () => {
  await rm(folder, { recursive: true, force: true });
});

function buildParts(): MultipartPart[] {
  const meta = JSON.stringify({ branch: 'feature/lantern-arm', commit: '3f2a9c1d', label: '#12 «Tidewatch»' });
  return [
    { kind: 'field', name: 'meta', value: meta, contentType: 'application/json; charset=utf-8' },
    {
      kind: 'file',
      name: 'file',
      fileName: 'chars/keeper.glb',
      absolutePath: join(folder, 'keeper.glb'),
      byteLength: bigBytes.length,
      contentType: 'model/gltf-binary'
    },
    {
      kind: 'file',
      name: 'file',
      fileName: 'props/lantern "brass" ünïcode.bin',
      absolutePath: join(folder, 'lantern.bin'),
      byteLength: binBytes.length
    },
    { kind: 'file', name: 'file', fileName: 'props/empty.bin', absolutePath: join(folder, 'empty.bin'), byteLength: 0 }
  ];
}

describe('createMultipartBody', () => {
  it('streams a body that busboy parses back into the same parts, byte for byte', async () => {
    const body = createMultipartBody(buildParts());
    const parts = await parseWithBusboy(body.open(), body.contentType);
    expect(parts.map(({ name, fileName, mimeType }) => ({ name, fileName, mimeType }))).toEqual([
      { name: 'meta', fileName: null, mimeType: 'application/json' },
      { name: 'file', fileName: 'chars/keeper.glb', mimeType: 'model/gltf-binary' },
      { name: 'file', fileName: 'props/lantern "brass" ünïcode.bin', mimeType: 'application/octet-stream' },
      { name: 'file', fileName: 'props/empty.bin', mimeType: 'application/octet-stream' }
    ]);
    expect(JSON.parse(parts[0].bytes.toString('utf8'))).toEqual({
      branch: 'feature/lantern-arm',
      commit: '3f2a9c1d',
      label: '#12 «Tidewatch»'
    });
    expect(parts[1].bytes.equals(bigBytes)).toBe(true);
    expect(parts[2].bytes.equals(binBytes)).toBe(true);
    expect(parts[3].bytes.length).toBe(0);
  });

  it('announces exactly the length it streams, so Content-Length is right', async () => {
    const body = createMultipartBody(buildParts());
    const bytes = await readAll(body.open());
    expect(bytes.length).toBe(body.byteLength);
  });

  it('streams the file in several chunks, reporting each to the progress callback', async () => {
    const body = createMultipartBody(buildParts());
    const sizes: number[] = [];
    await readAll(body.open((byteLength) => sizes.push(byteLength)));
    expect(sizes.reduce((sum, size) => sum + size, 0)).toBe(body.byteLength);
    // 1.5 MiB cannot come in one read of at most 1 MiB.
    expect(Math.max(...sizes)).toBeLessThanOrEqual(1024 * 1024);
    expect(sizes.filter((size) => size > 64 * 1024).length).toBeGreaterThanOrEqual(2);
  });

  it('opens a fresh stream each time, so a retry sends the whole body again', async () => {
    const body = createMultipartBody(buildParts(), 'fixed-boundary');
    const first = await readAll(body.open());
    const second = await readAll(body.open());
    expect(second.equals(first)).toBe(true);
  });

  it('draws a new random boundary of at most 70 characters (RFC 2046) for each body', () => {
    const first = createMultipartBody(buildParts()).contentType;
    const second = createMultipartBody(buildParts()).contentType;
    const boundaryOf = (contentType: string) => /boundary=(.+)$/.exec(contentType)![1];
    expect(boundaryOf(first)).toMatch(/^orientry-[0-9a-f]{60}$/);
    expect(boundaryOf(first).length).toBeLessThanOrEqual(70);
    expect(boundaryOf(second)).not.toBe(boundaryOf(first));
  });

  it('lays out the parts as RFC 7578 describes, with the boundary given', async () => {
    const meta: MultipartPart = { kind: 'field', name: 'meta', value: '{}' };
    const body = createMultipartBody([meta], 'b0undary');
    const text = (await readAll(body.open())).toString('utf8');
    expect(text).toBe('--b0undary\r\nContent-Disposition: form-data; name="meta"\r\n\r\n{}\r\n--b0undary--\r\n');
    expect(body.contentType).toBe('multipart/form-data; boundary=b0undary');
  });

  it('fails the stream with input.changed when a file shrank after it was measured', async () => {
    const path = join(folder, 'shrinking.bin');
    await writeFile(path, Buffer.alloc(1000, 7));
    const body = createMultipartBody([
      { kind: 'file', name: 'file', fileName: 'shrinking.bin', absolutePath: path, byteLength: 1000 }
    ]);
    await truncate(path, 10);
    const failure = await readAll(body.open()).catch((error: unknown) => error);
    expect(failure).toBeInstanceOf(CliError);
    expect((failure as CliError).code).toBe('input.changed');
  });

  it('fails the stream with input.changed when a file grew, without sending the extra bytes', async () => {
    const path = join(folder, 'growing.bin');
    await writeFile(path, Buffer.alloc(100, 7));
    const body = createMultipartBody([
      { kind: 'file', name: 'file', fileName: 'growing.bin', absolutePath: path, byteLength: 50 }
    ]);
    const failure = await readAll(body.open()).catch((error: unknown) => error);
    expect((failure as CliError).code).toBe('input.changed');
  });

  it('fails the stream with input.unreadable when a file disappeared', async () => {
    const body = createMultipartBody([
      { kind: 'file', name: 'file', fileName: 'gone.bin', absolutePath: join(folder, 'gone.bin'), byteLength: 3 }
    ]);
    const failure = await readAll(body.open()).catch((error: unknown) => error);
    expect((failure as CliError).code).toBe('input.unreadable');
    expect((failure as CliError).message).toContain('ENOENT');
  });
});

import crypto from 'node:crypto';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterEach, describe, expect, it } from 'vitest';
import { CliError } from './cli-error';
import { ExitCode } from './exit-codes';
import { exchange, NetworkError } from './http-exchange';

/** A throw-away server on a free port of the loopback interface. */
async function serve(handler: http.RequestListener): Promise<URL> {
  const server = http.createServer(handler);
  servers.push(server);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  return new URL(`http://127.0.0.1:${(server.address() as AddressInfo).port}/api/v1/thing`);
}

const servers: http.Server[] = [];
afterEach(async () => {
  for (const server of servers.splice(0)) {
    server.closeAllConnections();
    await new Promise((resolve) => server.close(resolve));
  }
});

async function* chunksOf(...parts: string[]): AsyncGenerator<Uint8Array> {
  for (const part of parts) yield Buffer.from(part);
}

describe('exchange', () => {
  it('streams the body in order with its headers and reads the whole answer', async () => {
    let received = '';
    let seenHeaders: http.IncomingHttpHeaders = {};
    const url = await serve((request, response) => {
      seenHeaders = request.headers;
      request.setEncoding('utf8').on('data', (text: string) => (received += text));
      request.on('end', () => {
        response.writeHead(201, { 'content-type': 'application/json', 'retry-after': '3' });
        response.end(JSON.stringify({ length: received.length }));
      });
    });
    // 64 chunks of 64 KiB: more than a socket buffer holds, so writes wait for drains.
    const chunk = 'x'.repeat(64 * 1024);
    const answer = await exchange(url, {
      method: 'POST',
      headers: { 'content-type': 'text/plain', 'content-length': String(64 * chunk.length), origin: url.origin },
      body: chunksOf(...Array.from({ length: 64 }, () => chunk)),
      timeoutMs: 10_000
    });
    expect(answer.status).toBe(201);
    expect(answer.headers.get('Content-Type')).toBe('application/json');
    expect(answer.headers.get('retry-after')).toBe('3');
    expect(answer.headers.get('location')).toBeNull();
    expect(JSON.parse(await answer.text())).toEqual({ length: 64 * chunk.length });
    expect(received).toBe(chunk.repeat(64));
    expect(seenHeaders.origin).toBe(url.origin);
  });

  it('is done with a chunk before it asks for the chunk after the next one, so its memory may be reused', async () => {
    const url = await serve((request, response) => {
      const hash = crypto.createHash('sha256');
      request.on('data', (chunk: Buffer) => hash.update(chunk));
      request.on('end', () => response.end(hash.digest('hex')));
    });
    // Two buffers taking turns, each refilled as soon as the contract allows (as MultipartBody does).
    const buffers = [Buffer.alloc(512 * 1024), Buffer.alloc(512 * 1024)];
    const expected = crypto.createHash('sha256');
    async function* takingTurns(): AsyncGenerator<Uint8Array> {
      for (let index = 0; index < 48; index++) {
        const buffer = buffers[index % 2].fill(index);
        expected.update(buffer);
        yield buffer;
      }
    }
    const answer = await exchange(url, {
      method: 'POST',
      headers: { 'content-length': String(48 * 512 * 1024) },
      body: takingTurns(),
      timeoutMs: 10_000
    });
    expect(await answer.text()).toBe(expected.digest('hex'));
  });

  it('stops sending when the server answers before reading the body, and closes what it was reading', async () => {
    const url = await serve((_request, response) => {
      response.writeHead(401, { 'content-type': 'application/json' });
      response.end('{"error":{"code":"auth.token-invalid","message":"no"}}');
    });
    let yielded = 0;
    let isClosed = false;
    async function* endless(): AsyncGenerator<Uint8Array> {
      try {
        for (;;) {
          yielded++;
          yield Buffer.alloc(256 * 1024);
        }
      } finally {
        isClosed = true;
      }
    }
    const answer = await exchange(url, {
      method: 'POST',
      headers: { 'content-length': String(2 ** 40) },
      body: endless(),
      timeoutMs: 10_000
    });
    expect(answer.status).toBe(401);
    expect(await answer.text()).toContain('auth.token-invalid');
    await expect.poll(() => isClosed).toBe(true);
    expect(yielded).toBeLessThan(4096);
  });

  it('fails with a NetworkError naming the socket error when nothing listens', async () => {
    const url = await serve(() => {});
    servers[0].close();
    await new Promise((resolve) => setTimeout(resolve, 10));
    const failure = await exchange(url, { method: 'GET', headers: {}, timeoutMs: 10_000 }).catch((error) => error);
    expect(failure).toBeInstanceOf(NetworkError);
    expect((failure.cause as NodeJS.ErrnoException).code).toBe('ECONNREFUSED');
  });

  it('fails with a TimeoutError when the answer does not come within the limit', async () => {
    const url = await serve(() => {
      // Never answers.
    });
    const startedAt = Date.now();
    const failure = await exchange(url, { method: 'GET', headers: {}, timeoutMs: 150 }).catch((error) => error);
    expect((failure as Error).name).toBe('TimeoutError');
    expect(Date.now() - startedAt).toBeGreaterThanOrEqual(140);
  });

  it('fails with the error the body threw, not a network error', async () => {
    const url = await serve((request) => request.resume());
    const changed = new CliError('input.changed', 'keeper.glb: the file changed', ExitCode.UsageError);
    async function* breaking(): AsyncGenerator<Uint8Array> {
      yield Buffer.from('first part');
      throw changed;
    }
    const failure = await exchange(url, {
      method: 'POST',
      headers: { 'content-length': '1000' },
      body: breaking(),
      timeoutMs: 10_000
    }).catch((error) => error);
    expect(failure).toBe(changed);
  });

  it('fails with a NetworkError when the server drops the connection mid-answer', async () => {
    const url = await serve((_request, response) => {
      response.writeHead(200, { 'content-length': '1000' });
      response.write('only part of it');
      setTimeout(() => response.socket?.destroy(), 20);
    });
    const failure = await exchange(url, { method: 'GET', headers: {}, timeoutMs: 10_000 }).catch((error) => error);
    expect(failure).toBeInstanceOf(NetworkError);
  });

  it('fails at once, without a stray timer, on a header value Node refuses', async () => {
    const url = await serve(() => {});
    const failure = await exchange(url, {
      method: 'GET',
      headers: { authorization: 'Bearer one\ntwo' },
      timeoutMs: 50
    }).catch((error) => error);
    expect((failure as NodeJS.ErrnoException).code).toBe('ERR_INVALID_CHAR');
    // Past the limit nothing else fires (a stray timer would throw on a request never made).
    await new Promise((resolve) => setTimeout(resolve, 100));
  });
});

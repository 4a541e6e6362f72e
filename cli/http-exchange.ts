/**
 * One HTTP(S) exchange over node:http and node:https: the request body streamed from an async
 * iterable with backpressure, the answer read whole within one time limit.
 *
 * Why not fetch: on Node 20 the first fetch of a process loads undici and compiles its
 * WebAssembly HTTP parser, and the process waits for that compile before it can exit. Measured
 * on `orientry submit` of the ingest benchmark: about 0.1 s of wall clock per run (the exit alone
 * waited 60–75 ms) and 0.1 s of CPU taken from the upload. node:http's parser is built into Node.
 */
import http from 'node:http';
import https from 'node:https';

/** What the CLI reads of an answer; fetch's Response has the same shape, which tests use. */
export interface HttpAnswer {
  status: number;
  statusText: string;
  headers: { get(name: string): string | null };
  text(): Promise<string>;
}

/** One request. */
export interface HttpExchange {
  method: 'GET' | 'POST';
  headers: Record<string, string>;
  /**
   * Sent in order; an error it throws (an input file that changed) ends the exchange with that
   * error. A chunk is written out before the chunk after the next one is requested, so the
   * producer may then reuse its memory.
   */
  body?: AsyncIterable<Uint8Array>;
  /** Limit for the whole exchange, from the first byte sent to the last byte of the answer. */
  timeoutMs: number;
}

/** The request got no answer: the connection was refused or broke (the socket's error is the cause). */
export class NetworkError extends Error {
  override readonly name = 'NetworkError';
}

/**
 * Sends the request and resolves with the whole answer. An answer that arrives before the body
 * is sent (a refusal, or a build the server already has) ends the upload: the rest is not sent.
 * @throws NetworkError without an answer; an Error named `TimeoutError` past the limit; or what
 *   the body threw.
 */
export function exchange(url: URL, request: HttpExchange): Promise<HttpAnswer> {
  const transport = url.protocol === 'https:' ? https : http;
  return new Promise<HttpAnswer>((resolve, reject) => {
    let outgoing: http.ClientRequest;
    try {
      // agent: false: one connection per exchange, closed after it, so nothing keeps the process alive.
      outgoing = transport.request(url, { method: request.method, headers: request.headers, agent: false });
    } catch (error) {
      // A header value Node refuses (a control character): nothing was sent.
      reject(error);
      return;
    }
    let isSettled = false;
    const settle = (outcome: () => void) => {
      if (isSettled) return;
      isSettled = true;
      clearTimeout(timer);
      outcome();
      // Unsent body bytes, or an answer cut short: the connection cannot serve another request.
      outgoing.destroy();
    };
    const fail = (error: unknown) => settle(() => reject(error));
    const timer = setTimeout(() => fail(timeoutError(request.timeoutMs)), request.timeoutMs);

    outgoing.on('response', (incoming) => {
      const chunks: Buffer[] = [];
      incoming.on('data', (chunk: Buffer) => chunks.push(chunk));
      incoming.on('error', (error) => fail(networkError(error)));
      incoming.on('end', () => settle(() => resolve(answerOf(incoming, Buffer.concat(chunks)))));
    });
    outgoing.on('error', (error) => fail(networkError(error)));
    sendBody(outgoing, request.body, () => isSettled).catch(fail);
  });
}

/**
 * Writes the body with at most two chunks in flight: before asking for the next chunk it waits
 * until the one before the current chunk has been handed to the socket. That is backpressure,
 * and it lets the producer refill that chunk's buffer (see MultipartBody.open).
 */
async function sendBody(
  outgoing: http.ClientRequest,
  body: AsyncIterable<Uint8Array> | undefined,
  isSettled: () => boolean
): Promise<void> {
  let previousWrite: Promise<void> = Promise.resolve();
  if (body) {
    for await (const chunk of body) {
      if (isSettled()) return;
      // The callback also comes (with an error) when the request is destroyed; 'error' reports that.
      const written = new Promise<void>((resolve) => outgoing.write(chunk, () => resolve()));
      await previousWrite;
      previousWrite = written;
    }
  }
  await previousWrite;
  if (!isSettled()) outgoing.end();
}

function answerOf(incoming: http.IncomingMessage, body: Buffer): HttpAnswer {
  const { headers } = incoming;
  return {
    status: incoming.statusCode ?? 0,
    statusText: incoming.statusMessage ?? '',
    headers: {
      get(name) {
        const value = headers[name.toLowerCase()];
        return value === undefined ? null : Array.isArray(value) ? value.join(', ') : value;
      }
    },
    text: async () => body.toString('utf8')
  };
}

function networkError(cause: Error): NetworkError {
  return new NetworkError(cause.message, { cause });
}

function timeoutError(timeoutMs: number): Error {
  return Object.assign(new Error(`no answer within ${timeoutMs / 1000} s`), { name: 'TimeoutError' });
}

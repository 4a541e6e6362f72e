/**
 * Reading and dropping the rest of a request body the server answered without needing it, such
 * as an upload answered from its `Idempotency-Key` header. A client that keeps sending after the
 * answer then finishes its request on a healthy connection, instead of blocking on a full socket
 * until a timeout; fetch clients stop sending on their own once the answer is complete, which
 * ends the reading here too.
 *
 * Design notes: answering with `Connection: close` was tried first. The server then closes the
 * socket while the client is still writing, and in the first benchmark run a repeated 100 MB
 * upload from the CLI failed with EPIPE instead of reading the answer; no run has since the close
 * was left to the client (fetch closes it itself once it has the whole answer).
 */
import { Readable } from 'node:stream';

/**
 * Reads `request`'s body to its end, discarding it, and drops the connection once more than
 * `maxByteLength` bytes have come. Never rejects: a client that goes away ends it early.
 */
export async function discardBody(request: Request, maxByteLength: number): Promise<void> {
  if (!request.body || request.bodyUsed) return;
  const body = Readable.fromWeb(request.body as import('node:stream/web').ReadableStream);
  let byteLength = 0;
  try {
    for await (const chunk of body as AsyncIterable<Buffer>) {
      byteLength += chunk.length;
      if (byteLength > maxByteLength) {
        body.destroy();
        return;
      }
    }
  } catch (error) {
    // The client closed the connection once it had the answer: nothing is left to discard.
    if (process.env.DEBUG) console.debug('discarding an unneeded request body ended early', error);
  }
}

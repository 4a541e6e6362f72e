/**
 * A multipart/form-data request body (RFC 7578) streamed from disk: files are read in chunks as
 * the connection takes them, so a build of any size is uploaded without holding it in memory.
 * The total length is known up front from the file sizes, so the request carries a
 * Content-Length and the server can refuse an oversized upload before reading it.
 */
import { randomBytes } from 'node:crypto';
import { open, type FileHandle } from 'node:fs/promises';
import { CliError } from './cli-error';
import { ExitCode } from './exit-codes';

/** A text field, e.g. the build's `meta` JSON. */
export interface MultipartField {
  kind: 'field';
  name: string;
  value: string;
  contentType?: string;
}

/** A file read from disk when the body streams. */
export interface MultipartFile {
  kind: 'file';
  name: string;
  /** The `filename` parameter; for a build upload, the file's relative path. */
  fileName: string;
  absolutePath: string;
  /** Size measured beforehand; a file that no longer has it fails the upload. */
  byteLength: number;
  contentType?: string;
}

/** One part of the body, in the order it is sent. */
export type MultipartPart = MultipartField | MultipartFile;

/** A body that can be streamed as often as an upload is attempted. */
export interface MultipartBody {
  /** The request's Content-Type, with the boundary. */
  contentType: string;
  /** Exact length of every stream `open` returns, for Content-Length. */
  byteLength: number;
  /**
   * The whole body, chunk by chunk, read afresh on every call (each retry needs its own).
   * Stopping early closes the file being read. A chunk stays intact only until the chunk after
   * the next one is requested: file content comes in two read buffers that take turns, so a
   * consumer that keeps chunks longer must copy them.
   * @param onBytes called with the size of each chunk as the reader takes it, for progress.
   */
  open(onBytes?: (byteLength: number) => void): AsyncIterable<Uint8Array>;
}

/**
 * File content is read into two buffers of this size that take turns (see MultipartBody.open):
 * reading into fresh 256 KiB chunks, as a read stream does, cost the 100 MB upload of the
 * ingest benchmark about 100 ms more CPU (allocation, garbage collection and more syscalls).
 */
const READ_BUFFER_BYTES = 1024 * 1024;
const CRLF = '\r\n';

/**
 * Lays out the parts and returns the body; nothing is read until a stream is opened.
 * @param boundary a fixed boundary for tests; by default 30 random bytes in hex, which no file
 *   will contain by chance (RFC 2046 §5.1.1 asks only that it not occur in the content).
 */
export function createMultipartBody(parts: readonly MultipartPart[], boundary = newBoundary()): MultipartBody {
  const heads = parts.map((part) => Buffer.from(partHead(part, boundary), 'utf8'));
  const tail = Buffer.from(`--${boundary}--${CRLF}`, 'utf8');
  let byteLength = tail.length;
  for (const [index, part] of parts.entries()) {
    const contentLength = part.kind === 'field' ? Buffer.byteLength(part.value, 'utf8') : part.byteLength;
    byteLength += heads[index].length + contentLength + CRLF.length;
  }
  return {
    contentType: `multipart/form-data; boundary=${boundary}`,
    byteLength,
    async *open(onBytes) {
      const buffers = [Buffer.allocUnsafe(READ_BUFFER_BYTES), Buffer.allocUnsafe(READ_BUFFER_BYTES)];
      let turn = 0;
      const nextBuffer = () => buffers[turn++ % 2];
      for await (const chunk of bodyChunks(parts, heads, tail, nextBuffer)) {
        onBytes?.(chunk.byteLength);
        yield chunk;
      }
    }
  };
}

async function* bodyChunks(
  parts: readonly MultipartPart[],
  heads: readonly Buffer[],
  tail: Buffer,
  nextBuffer: () => Buffer
): AsyncGenerator<Uint8Array, void, undefined> {
  const crlf = Buffer.from(CRLF);
  for (const [index, part] of parts.entries()) {
    yield heads[index];
    if (part.kind === 'field') yield Buffer.from(part.value, 'utf8');
    else yield* fileChunks(part, nextBuffer);
    yield crlf;
  }
  yield tail;
}

/** Yields the file's chunks, failing when the file is no longer the size measured before. */
async function* fileChunks(file: MultipartFile, nextBuffer: () => Buffer): AsyncGenerator<Uint8Array, void, undefined> {
  let byteLength = 0;
  let handle: FileHandle | null = null;
  try {
    handle = await open(file.absolutePath, 'r');
    for (;;) {
      const buffer = nextBuffer();
      const { bytesRead } = await handle.read(buffer, 0, buffer.length, null);
      if (bytesRead === 0) break;
      byteLength += bytesRead;
      // Past the measured size the Content-Length would be a lie; stop before sending it.
      if (byteLength > file.byteLength) break;
      yield buffer.subarray(0, bytesRead);
    }
  } catch (error) {
    const reason = (error as { code?: string }).code ?? (error as Error).message;
    throw new CliError('input.unreadable', `${file.fileName}: cannot read the file (${reason})`, ExitCode.UsageError, {
      cause: error
    });
  } finally {
    await handle?.close();
  }
  if (byteLength !== file.byteLength) {
    throw new CliError(
      'input.changed',
      `${file.fileName}: the file changed while it was uploaded (measured ${file.byteLength} bytes, then ` +
        `${byteLength > file.byteLength ? 'it grew' : `read ${byteLength}`}); submit again once the build output is complete`,
      ExitCode.UsageError
    );
  }
}

/** `--boundary`, Content-Disposition and Content-Type lines, and the blank line before the content. */
function partHead(part: MultipartPart, boundary: string): string {
  const disposition =
    part.kind === 'file'
      ? `form-data; name="${quoted(part.name)}"; filename="${quoted(part.fileName)}"`
      : `form-data; name="${quoted(part.name)}"`;
  const contentType = part.contentType ?? (part.kind === 'file' ? 'application/octet-stream' : undefined);
  const lines = [`--${boundary}`, `Content-Disposition: ${disposition}`];
  if (contentType) lines.push(`Content-Type: ${contentType}`);
  return lines.join(CRLF) + CRLF + CRLF;
}

/**
 * A parameter value for a quoted-string (RFC 9110 §5.6.4): backslash and double quote escaped.
 * Line breaks and other control characters cannot be carried at all; callers refuse such names
 * first, so meeting one here is a bug.
 */
function quoted(value: string): string {
  // eslint-disable-next-line no-control-regex -- control characters are exactly what is refused
  if (/[\u0000-\u001f\u007f]/.test(value)) throw new Error(`multipart: control character in "${value}"`);
  return value.replace(/[\\"]/g, (character) => `\\${character}`);
}

/**
 * 69 characters, near RFC 2046's limit of 70 on purpose: the server's parser searches the body
 * for the boundary Boyer-Moore-Horspool style, skipping up to the boundary's length per step, so
 * a longer boundary is a faster search. Measured on the ingest benchmark's 100 MB of GLB files
 * with busboy's search: 63 ms for a 57-character boundary, 29 ms for this one.
 */
function newBoundary(): string {
  return `orientry-${randomBytes(30).toString('hex')}`;
}

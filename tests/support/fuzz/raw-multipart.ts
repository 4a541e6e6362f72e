/**
 * Multipart bodies written byte by byte (RFC 7578), so tests can send what no form library would:
 * file names with `..`, backslashes, NUL or invalid UTF-8, parts without headers, bodies cut off
 * in the middle, and boundaries that do not match the header.
 */

/** One part: its header lines (without the trailing blank line) and its body. */
export interface RawPart {
  headers: string[];
  body: Uint8Array | string;
}

/** Options of {@link rawMultipart}. */
export interface RawMultipartOptions {
  /** Cut the finished body to this many bytes (a client that stopped sending). */
  truncateAt?: number;
  /** Leave out the closing `--boundary--`. */
  isUnterminated?: boolean;
}

/** The body bytes of `parts` separated by `boundary`. */
export function rawMultipart(
  parts: readonly RawPart[],
  boundary: string,
  options: RawMultipartOptions = {}
): Buffer<ArrayBuffer> {
  const chunks: Buffer[] = [];
  for (const part of parts) {
    chunks.push(Buffer.from(`--${boundary}\r\n${part.headers.map((line) => `${line}\r\n`).join('')}\r\n`, 'latin1'));
    chunks.push(typeof part.body === 'string' ? Buffer.from(part.body, 'utf8') : Buffer.from(part.body));
    chunks.push(Buffer.from('\r\n'));
  }
  if (!options.isUnterminated) chunks.push(Buffer.from(`--${boundary}--\r\n`));
  const body = Buffer.concat(chunks);
  return options.truncateAt === undefined ? body : body.subarray(0, options.truncateAt);
}

/** A `file` part named `fileName`; the name goes out as raw bytes (latin1), so it may carry anything. */
export function filePart(fileName: string | Buffer, body: Uint8Array | string): RawPart {
  const name =
    typeof fileName === 'string' ? Buffer.from(fileName, 'utf8').toString('latin1') : fileName.toString('latin1');
  return {
    headers: [
      `Content-Disposition: form-data; name="file"; filename="${name}"`,
      'Content-Type: application/octet-stream'
    ],
    body
  };
}

/** The `meta` part holding `text`. */
export function metaPart(text: string): RawPart {
  return { headers: ['Content-Disposition: form-data; name="meta"'], body: text };
}

/**
 * Decodes a base64 `data:` URI (glTF 2.0 §3.6.1.1; RFC 2397, RFC 4648 §4) into bytes, strictly:
 * a character outside the alphabet, a bad length or misplaced padding is an error, never
 * silently skipped. Pure TypeScript so the browser and Node decode identically.
 */
import { AssetReadError } from '../asset-read-error';

const ALPHABET = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/';
const INVALID = 255;
const DECODE_TABLE = new Uint8Array(128).fill(INVALID);
for (let index = 0; index < ALPHABET.length; index++) DECODE_TABLE[ALPHABET.charCodeAt(index)] = index;

/**
 * The bytes of a `data:[<mediatype>];base64,<data>` URI.
 * @param where names the referring property for messages, e.g. `buffers[0]`.
 * @throws AssetReadError `asset.uri-invalid` for anything malformed.
 */
export function decodeDataUri(uri: string, assetPath: string, where: string): Uint8Array {
  const fail = (reason: string) =>
    new AssetReadError(
      'asset.uri-invalid',
      `${assetPath}: ${where}.uri is a malformed data URI: ${reason}.`,
      'Export the asset again; embedded data must be base64 (data:application/octet-stream;base64,...).'
    );
  const comma = uri.indexOf(',');
  if (comma < 0) throw fail('no comma separating the header from the data');
  const header = uri.slice(0, comma);
  if (!/;base64$/i.test(header)) throw fail(`header "${header.slice(0, 60)}" is not base64-encoded`);

  const start = comma + 1;
  const dataLength = uri.length - start;
  if (dataLength % 4 !== 0) throw fail(`base64 length ${dataLength} is not a multiple of 4`);
  let padding = 0;
  if (dataLength > 0 && uri.charCodeAt(uri.length - 1) === 61) padding++;
  if (dataLength > 1 && uri.charCodeAt(uri.length - 2) === 61) padding++;
  const byteLength = (dataLength / 4) * 3 - padding;
  const bytes = new Uint8Array(byteLength);

  let byteIndex = 0;
  const end = uri.length - padding;
  for (let position = start; position < end; position += 4) {
    const a = sextet(uri, position, end);
    const b = sextet(uri, position + 1, end);
    const c = sextet(uri, position + 2, end);
    const d = sextet(uri, position + 3, end);
    if (a === INVALID || b === INVALID || c === INVALID || d === INVALID) {
      throw fail(`character at offset ${findInvalid(uri, start, end) - start} is not base64`);
    }
    const triple = (a << 18) | (b << 12) | (c << 6) | d;
    bytes[byteIndex++] = triple >> 16;
    if (byteIndex < byteLength) bytes[byteIndex++] = (triple >> 8) & 0xff;
    if (byteIndex < byteLength) bytes[byteIndex++] = triple & 0xff;
  }
  return bytes;
}

/** The 6-bit value at `position`; 0 for positions taken by trailing padding. */
function sextet(text: string, position: number, end: number): number {
  if (position >= end) return 0;
  const code = text.charCodeAt(position);
  return code < 128 ? DECODE_TABLE[code] : INVALID;
}

function findInvalid(text: string, start: number, end: number): number {
  for (let position = start; position < end; position++) {
    const code = text.charCodeAt(position);
    if (code >= 128 || DECODE_TABLE[code] === INVALID) return position;
  }
  return end;
}

/**
 * Turns a buffer or image `uri` (glTF 2.0 §3.6.1.1, RFC 3986 relative reference) into a path
 * relative to the main file's folder, or refuses it. This is the one gate between a file's
 * JSON and the caller's `readSideFile`: anything that could name a file outside the folder
 * (parent segments climbing out, absolute paths, schemes such as `file:` or `http:`,
 * backslashes, drive letters, NUL) is refused here and never reaches the caller.
 */
import { AssetReadError } from '../asset-read-error';
import { shortenForMessage as shorten } from './shorten-for-message';

/** True for a `data:` URI (embedded bytes, never a side file). */
export function isDataUri(uri: string): boolean {
  return /^data:/i.test(uri);
}

/**
 * The side-file path a relative URI names, e.g. `textures/skin%20tone.png` → `textures/skin tone.png`,
 * `anim/../hero.bin` → `hero.bin`.
 * @param where names the referring property for messages, e.g. `buffers[2]`.
 * @throws AssetReadError `asset.uri-outside-folder` or `asset.uri-invalid`.
 */
export function resolveSideFilePath(uri: string, assetPath: string, where: string): string {
  const refuse = (reason: string) =>
    new AssetReadError(
      'asset.uri-outside-folder',
      `${assetPath}: ${where}.uri "${shorten(uri)}" ${reason}, so it was not opened.`,
      'Reference side files by relative paths inside the asset folder (e.g. "hero.bin"), or embed them.'
    );
  if (uri.length === 0) {
    throw new AssetReadError('asset.uri-invalid', `${assetPath}: ${where}.uri is empty.`, 'Export the asset again.');
  }
  // A scheme (RFC 3986 §3.1) means an absolute URI: file:, http:, and also a Windows drive letter.
  if (/^[a-z][a-z0-9+.-]*:/i.test(uri)) throw refuse('is an absolute URI');
  if (uri.startsWith('/')) throw refuse('is an absolute path');
  if (uri.includes('\\')) throw refuse('contains a backslash');

  // Query and fragment do not name a file (RFC 3986 §3.4, §3.5).
  const reference = uri.replace(/[?#].*$/s, '');
  let decoded: string;
  try {
    decoded = decodeURIComponent(reference);
  } catch (error) {
    throw new AssetReadError(
      'asset.uri-invalid',
      `${assetPath}: ${where}.uri "${shorten(uri)}" has malformed percent-encoding.`,
      'Percent-encode the file name correctly (e.g. a space as %20).',
      { cause: error }
    );
  }
  // Decoding may reveal what the raw text hid (%2e%2e, %5c, %00, %2f at the start).
  // eslint-disable-next-line no-control-regex
  if (/[\u0000-\u001f]/.test(decoded)) throw refuse('contains control characters');
  if (decoded.includes('\\')) throw refuse('contains an encoded backslash');
  if (decoded.startsWith('/')) throw refuse('decodes to an absolute path');
  if (/^[a-z][a-z0-9+.-]*:/i.test(decoded)) throw refuse('decodes to an absolute URI');

  const segments: string[] = [];
  for (const segment of decoded.split('/')) {
    if (segment === '' || segment === '.') continue;
    if (segment === '..') {
      if (segments.length === 0) throw refuse('climbs out of the asset folder');
      segments.pop();
      continue;
    }
    segments.push(segment);
  }
  if (segments.length === 0) {
    throw new AssetReadError(
      'asset.uri-invalid',
      `${assetPath}: ${where}.uri "${shorten(uri)}" names the folder itself, not a file.`,
      'Point the URI at the side file, e.g. "hero.bin".'
    );
  }
  return segments.join('/');
}

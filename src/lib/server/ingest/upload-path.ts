/**
 * Validation of the relative paths a build's files are uploaded under. The path names the
 * file in reports and decides where it lands in the upload folder, so anything that could
 * escape that folder or mean two things is refused before a byte is written.
 */
import { ApiError } from './api-error';

/** Largest accepted path length in characters; deeper trees than this are not real asset folders. */
const MAX_PATH_LENGTH = 1024;

/** Largest file or folder name in UTF-8 bytes: NAME_MAX of ext4, XFS and most other file systems. */
const MAX_SEGMENT_BYTES = 255;

/**
 * Checks an uploaded file's relative path and returns it unchanged when it is safe:
 * forward slashes only, no leading slash or drive letter, no `.`/`..`/empty segments, no NUL
 * or other control characters, no name the file system cannot hold (over 255 bytes).
 *
 * @example validateUploadPath('chars/hero.gltf') → 'chars/hero.gltf'
 * @example validateUploadPath('../etc/passwd') → throws ApiError 400 `upload.path_invalid`
 * @throws ApiError (400, `upload.path_invalid`) naming the path and what is wrong with it.
 */
export function validateUploadPath(path: string): string {
  const problem = pathProblem(path);
  if (problem) {
    throw new ApiError(
      400,
      'upload.path-invalid',
      `file "${printable(path)}": ${problem}. Send each file under a relative path inside the build folder, e.g. "chars/hero.gltf".`
    );
  }
  return path;
}

/** Describes what is wrong with a path, or returns null when it is fine. */
function pathProblem(path: string): string | null {
  if (path.length === 0) return 'the path is empty';
  if (path.length > MAX_PATH_LENGTH) return `the path is longer than ${MAX_PATH_LENGTH} characters`;
  if (path.includes('\u0000')) return 'the path contains a NUL character';
  // eslint-disable-next-line no-control-regex -- control characters are exactly what is refused here
  if (/[\u0001-\u001f\u007f]/.test(path)) return 'the path contains a control character';
  if (path.includes('\\')) return 'the path contains a backslash (use forward slashes)';
  if (path.startsWith('/')) return 'the path is absolute';
  if (/^[A-Za-z]:/.test(path)) return 'the path starts with a drive letter';
  for (const segment of path.split('/')) {
    if (segment === '') return 'the path has an empty segment';
    if (segment === '..') return 'the path contains ".."';
    if (segment === '.') return 'the path contains "."';
    if (Buffer.byteLength(segment) > MAX_SEGMENT_BYTES) {
      return `a file or folder name is longer than ${MAX_SEGMENT_BYTES} bytes`;
    }
  }
  return null;
}

/** The path with control characters shown as escapes, so an error message stays one readable line. */
function printable(path: string): string {
  // eslint-disable-next-line no-control-regex -- escaping control characters for display
  return path.replace(/[\u0000-\u001f\u007f]/g, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
}

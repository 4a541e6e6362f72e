/**
 * Failures of the server's own storage, told apart from bugs: the data folder's disk is full, or
 * it cannot be written (a read-only mount, wrong permissions). A client then gets an answer it
 * can act on, 507 `storage.full` or 503 `storage.read-only`, instead of a generic 500, and the
 * message says what the operator must do. Stored builds are never at risk from these: blobs are
 * renamed into place whole and the database writes a build in one transaction.
 *
 * The cause is found by its code anywhere along the error's chain: Node's `ENOSPC`, `EDQUOT`,
 * `EROFS` and `EACCES` (errno(3)), SQLite's `SQLITE_FULL` and `SQLITE_READONLY` (result codes,
 * sqlite.org/rescode.html). Sequelize keeps the driver's error as `parent`/`original`.
 */
import { ApiError } from './api-error';

const FULL_CODES = new Set(['ENOSPC', 'EDQUOT', 'SQLITE_FULL']);
const READ_ONLY_CODES = new Set(['EROFS', 'EACCES', 'SQLITE_READONLY']);

/** The storage code behind `error` (e.g. `ENOSPC`), or null when it is not a storage failure. */
export function storageCodeOf(error: unknown): string | null {
  const seen = new Set<unknown>();
  const pending: unknown[] = [error];
  while (pending.length > 0) {
    const current = pending.pop();
    if (current === null || typeof current !== 'object' || seen.has(current)) continue;
    seen.add(current);
    const { code, cause, parent, original } = current as Record<string, unknown>;
    if (typeof code === 'string' && (FULL_CODES.has(code) || READ_ONLY_CODES.has(code))) return code;
    pending.push(cause, parent, original);
  }
  return null;
}

/**
 * The API answer for a storage failure, or null when `error` is something else.
 * @example storageFailureOf(Object.assign(new Error('no space'), { code: 'ENOSPC' }))?.status → 507
 */
export function storageFailureOf(error: unknown): ApiError | null {
  const code = storageCodeOf(error);
  if (code === null) return null;
  if (FULL_CODES.has(code)) {
    return new ApiError(
      507,
      'storage.full',
      `The server's data folder is out of space (${code}), so the build was not stored. ` +
        'An operator must free space in DATA_DIR or move it to a larger disk; builds already stored are not affected. ' +
        'Send the build again afterwards.',
      { cause: error }
    );
  }
  return new ApiError(
    503,
    'storage.read-only',
    `The server's data folder cannot be written (${code}), so the build was not stored. ` +
      'An operator must make DATA_DIR writable again (a read-only mount or wrong permissions); builds already ' +
      'stored are not affected and can still be read. Send the build again afterwards.',
    { cause: error }
  );
}

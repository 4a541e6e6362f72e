/**
 * The one mapping from the server's typed errors to page errors, for `load` functions and page
 * routes that call queries written for the API (which throw ApiError and friends).
 */
import { error } from '@sveltejs/kit';
import { AppError } from '../errors';

/**
 * Re-throws an expected failure (an AppError with an HTTP `status`, such as ApiError 404
 * `build.not-found`) as SvelteKit's `error(status, { message, code })`, so the error page shows
 * its message; anything else is unexpected and is re-thrown unchanged for `handleError`.
 *
 * @example const build = await getProjectBuild(project.id, params.id).catch(rethrowAsPageError);
 */
export function rethrowAsPageError(caught: unknown): never {
  if (caught instanceof AppError && 'status' in caught && typeof caught.status === 'number') {
    error(caught.status, { message: caught.message, code: caught.code });
  }
  throw caught;
}

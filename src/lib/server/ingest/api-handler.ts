/**
 * The one mapping from typed errors to API answers, and the wrapper every /api/v1 route uses.
 * Expected failures (ApiError and the server's typed errors, SvelteKit `error()` from shared
 * guards, the data folder full or read-only) become `{ error: { code, message } }` with their
 * status; anything else is unexpected and re-thrown to `handleError`, which logs it with an id.
 */
import { isHttpError, type RequestEvent } from '@sveltejs/kit';
import { AppError } from '../errors';
import { ApiError, apiError } from './api-error';
import { storageCodeOf, storageFailureOf } from './storage-error';

/** The answer for an expected failure, or null when `error` is unexpected. */
export function expectedErrorResponse(error: unknown): Response | null {
  if (error instanceof ApiError) return apiError(error.status, error.code, error.message);
  const storage = storageFailureOf(error);
  if (storage) {
    // The client is told; the operator who must act reads the server log.
    console.error(
      `Orientry storage: ${storage.code} (${storageCodeOf(error)}); a request was refused with ${storage.status}.`
    );
    return apiError(storage.status, storage.code, storage.message);
  }
  if (error instanceof AppError && 'status' in error && typeof error.status === 'number') {
    return apiError(error.status, error.code, error.message);
  }
  if (isHttpError(error)) {
    const body = error.body as { message?: string; code?: string };
    return apiError(error.status, body.code ?? `http.${error.status}`, body.message ?? 'Request failed.');
  }
  return null;
}

/**
 * Wraps a route handler so expected failures answer as JSON errors.
 * @example export const GET = apiHandler(async (event) => json(await list(event)));
 */
export function apiHandler<E extends RequestEvent>(
  handler: (event: E) => Promise<Response>
): (event: E) => Promise<Response> {
  return async (event) => {
    try {
      return await handler(event);
    } catch (error) {
      const response = expectedErrorResponse(error);
      if (response) return response;
      throw error;
    }
  };
}

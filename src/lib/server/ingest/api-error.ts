/**
 * Errors and error answers for the machine API under /api/v1/. Every failure a client can
 * cause becomes `{ error: { code, message } }` with the matching HTTP status, so the CLI can
 * print the message and branch on the stable dotted code.
 */

/** The body of every error answer of the API. */
export interface ApiErrorBody {
  error: { code: string; message: string };
}

import { AppError } from '../errors';

/**
 * An expected API failure: bad input, missing rights, unknown project, a limit reached.
 * Thrown anywhere below a route and turned into a response by {@link apiErrorResponse}.
 */
export class ApiError extends AppError {
  constructor(
    readonly status: number,
    code: string,
    message: string,
    options?: { cause?: unknown }
  ) {
    super(code, message, options);
  }
}

/**
 * A JSON error answer `{ error: { code, message } }` with the given status.
 * @example return apiError(404, 'project.not-found', 'No project "tidewatch". Check the project slug.');
 */
export function apiError(status: number, code: string, message: string, headers?: HeadersInit): Response {
  const body: ApiErrorBody = { error: { code, message } };
  const responseHeaders = new Headers(headers);
  responseHeaders.set('content-type', 'application/json; charset=utf-8');
  responseHeaders.set('cache-control', 'no-store');
  return new Response(JSON.stringify(body), { status, headers: responseHeaders });
}

/**
 * How `submit` reads the Orientry server's answers: which failures are worth another attempt
 * (network errors, timeouts, 408, 429, 5xx) and which are final, and the one-line message a CI
 * log shows for each. API errors arrive as `{ error: { code, message } }`; the server's code and
 * message are passed on as they are, since they already say what to do.
 */
import { CliError } from './cli-error';
import { ExitCode } from './exit-codes';
import { NetworkError, type HttpAnswer } from './http-exchange';
import { parseRetryAfter, type AttemptOutcome } from './retry-policy';

/** What an API error answer says. */
export interface ServerError {
  status: number;
  code: string;
  message: string;
}

/** Longest error body read; an error page larger than this says nothing more useful. */
const MAX_ERROR_BODY_CHARS = 64 * 1024;

/**
 * An absolute URL under the server's base URL (which may carry a path prefix).
 * @example apiUrl('https://ci.example/orientry/', 'api/v1/projects/tidewatch/builds')
 *   → https://ci.example/orientry/api/v1/projects/tidewatch/builds
 */
export function apiUrl(serverUrl: string, path: string): URL {
  const base = serverUrl.endsWith('/') ? serverUrl : `${serverUrl}/`;
  return new URL(path, base);
}

/** The status, code and message of a non-2xx answer, whatever its body holds. */
export async function readServerError(response: HttpAnswer): Promise<ServerError> {
  const text = (await response.text()).slice(0, MAX_ERROR_BODY_CHARS);
  let code = `http.${response.status}`;
  let message = text.trim().split('\n')[0]?.slice(0, 300) || response.statusText || 'no explanation given';
  try {
    const body = JSON.parse(text) as { error?: { code?: unknown; message?: unknown }; message?: unknown };
    if (typeof body.error?.code === 'string') code = body.error.code;
    if (typeof body.error?.message === 'string') message = body.error.message;
    else if (typeof body.message === 'string') message = body.message;
  } catch {
    // Not JSON (a proxy's error page): its first line, kept above, is the best explanation there is.
  }
  return { status: response.status, code, message: oneLine(message) };
}

/**
 * The outcome of a non-2xx answer: a retry for 408, 429 and 5xx (with the server's Retry-After),
 * else a thrown CliError: exit 2 for 400 (the upload itself is wrong), exit 3 for every other
 * refusal (token, rights, project, size limits, redirects).
 * @param action what was asked, for the message (`the upload`, `the report`).
 */
export async function outcomeOfFailure(response: HttpAnswer, action: string): Promise<AttemptOutcome<never>> {
  const error = await readServerError(response);
  if (isRetryableStatus(error.status)) return retryOutcome(error, response.headers.get('retry-after'));
  throw refusalOf(error, action, response.headers.get('location'));
}

/** True for the statuses worth another attempt: 408 (timeout), 429 (too many requests), 5xx. */
export function isRetryableStatus(status: number): boolean {
  return status === 408 || status === 429 || status >= 500;
}

/** A retry after a retryable answer, waiting as long as its Retry-After header asks, if it does. */
export function retryOutcome(error: ServerError, retryAfter: string | null): AttemptOutcome<never> {
  return {
    kind: 'retry',
    reason: `HTTP ${error.status} ${error.code}: ${error.message}`,
    retryAfterMs: parseRetryAfter(retryAfter, Date.now())
  };
}

/** The CliError for a final refusal; see {@link outcomeOfFailure}. */
export function refusalOf(error: ServerError, action: string, location: string | null = null): CliError {
  if (error.status >= 300 && error.status < 400) {
    return new CliError(
      'server.redirect',
      `the server redirected ${action} (HTTP ${error.status}) to ${location ?? 'somewhere unnamed'}; pass that address as --server`,
      ExitCode.ServerUnreachable
    );
  }
  const exitCode = error.status === 400 ? ExitCode.UsageError : ExitCode.ServerUnreachable;
  // The framework refuses a form post whose Origin is not the address the server is configured with.
  const hint =
    error.status === 403 && /cross-site/i.test(error.message)
      ? '; pass as --server the public address the server is configured with (its ORIGIN)'
      : '';
  return new CliError(
    error.code,
    `the server refused ${action} (HTTP ${error.status} ${error.code}): ${error.message}${hint}`,
    exitCode
  );
}

/**
 * The outcome of a request that got no answer: a retry naming the network error or timeout.
 * @throws the CliError that broke the request from our side (an input file that changed while
 *   it was sent), which no retry would mend; and anything that is not a network failure.
 */
export function outcomeOfNetworkError(error: unknown, timeoutSeconds: number): AttemptOutcome<never> {
  for (let cause: unknown = error; cause; cause = (cause as { cause?: unknown }).cause) {
    if (cause instanceof CliError) throw cause;
  }
  const name = (error as { name?: unknown }).name;
  if (name === 'TimeoutError') {
    return { kind: 'retry', reason: `no answer within ${timeoutSeconds} s`, retryAfterMs: null };
  }
  if (error instanceof NetworkError) {
    return { kind: 'retry', reason: describeNetworkError(error), retryAfterMs: null };
  }
  throw error;
}

function describeNetworkError(error: NetworkError): string {
  const cause = error.cause as { code?: unknown; message?: unknown; errors?: unknown } | undefined;
  if (!cause) return error.message;
  // Happy-eyeballs connects fail with an AggregateError holding one error per address.
  if (Array.isArray(cause.errors) && cause.errors.length > 0) {
    return oneLine(String((cause.errors[0] as Error).message ?? cause.errors[0]));
  }
  const message =
    typeof cause.message === 'string' && cause.message ? cause.message : String(cause.code ?? error.message);
  return oneLine(message);
}

function oneLine(text: string): string {
  return text.replace(/\s*[\r\n]+\s*/g, ' ').trim();
}

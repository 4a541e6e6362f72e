/**
 * How the build pages read the JSON API from the browser: the session cookie goes along, and an
 * `{ error: { code, message } }` answer becomes an {@link ApiRequestError} the page can show.
 */

/** A failed API request: the server's status, stable code and message for the reader. */
export class ApiRequestError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    options?: { cause?: unknown }
  ) {
    super(message, options);
    this.name = 'ApiRequestError';
  }
}

/**
 * GETs `url` and parses the JSON answer as `T` (trusted: it comes from our own API).
 * @throws ApiRequestError for an error answer or a network failure (status 0, code `network.failed`).
 */
export async function fetchJson<T>(url: string, signal?: AbortSignal): Promise<T> {
  let response: Response;
  try {
    response = await fetch(url, { headers: { accept: 'application/json' }, signal });
  } catch (caught) {
    if (caught instanceof DOMException && caught.name === 'AbortError') throw caught;
    throw new ApiRequestError(
      0,
      'network.failed',
      'The server could not be reached. Check the connection and try again.',
      {
        cause: caught
      }
    );
  }
  if (response.ok) return (await response.json()) as T;
  // A proxy's error page is not JSON: falling back to the status line still tells the reader what happened.
  const body = (await response.json().catch(() => null)) as { error?: { code?: string; message?: string } } | null;
  throw new ApiRequestError(
    response.status,
    body?.error?.code ?? `http.${response.status}`,
    body?.error?.message ?? `The server answered ${response.status} ${response.statusText}.`
  );
}

/** True when `caught` is the abort of a request the page replaced with a newer one. */
export function isAbort(caught: unknown): boolean {
  return caught instanceof DOMException && caught.name === 'AbortError';
}

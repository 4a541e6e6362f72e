/**
 * Validation of JSON request bodies with zod, for the API's session-authenticated writes.
 * Requiring `application/json` also keeps these writes out of reach of cross-site forms.
 */
import type { z } from 'zod';
import { ApiError } from './api-error';

/** Largest JSON body accepted, in bytes: these bodies carry a name or two, never files. */
const MAX_JSON_BYTES = 16 * 1024;

/**
 * Reads and validates a JSON body.
 * @throws ApiError 415 `body.content-type` for another content type, 400 `body.invalid` naming the bad field.
 */
export async function parseJsonBody<S extends z.ZodType>(request: Request, schema: S): Promise<z.output<S>> {
  const contentType = request.headers.get('content-type') ?? '';
  if (!/^application\/json\b/i.test(contentType)) {
    throw new ApiError(
      415,
      'body.content-type',
      `content-type: expected application/json, got "${contentType || 'none'}". Send the body as JSON.`
    );
  }
  const text = await request.text();
  if (Buffer.byteLength(text) > MAX_JSON_BYTES) {
    throw new ApiError(413, 'body.too-large', `The JSON body is larger than ${MAX_JSON_BYTES} bytes.`);
  }
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (error) {
    throw new ApiError(400, 'body.invalid', `The body is not valid JSON (${(error as Error).message}).`, {
      cause: error
    });
  }
  const result = schema.safeParse(value);
  if (result.success) return result.data;
  const issue = result.error.issues[0];
  const name = issue.path.length > 0 ? issue.path.map(String).join('.') : 'body';
  throw new ApiError(400, 'body.invalid', `${name}: ${issue.message}.`, { cause: result.error });
}

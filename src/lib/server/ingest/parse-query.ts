/**
 * Validation of API query strings with zod: the first bad parameter becomes a 400 that names it,
 * and handlers receive typed values.
 */
import type { z } from 'zod';
import { ApiError } from './api-error';

/**
 * Parses `searchParams` (single values; empty ones count as absent) with `schema`.
 * @throws ApiError 400 `query.invalid`, e.g. `pageSize: must be at most 100, got "500".`
 */
export function parseQuery<S extends z.ZodType>(searchParams: URLSearchParams, schema: S): z.output<S> {
  const values: Record<string, string> = {};
  for (const [name, value] of searchParams) if (value !== '') values[name] = value;
  const result = schema.safeParse(values);
  if (result.success) return result.data;
  const issue = result.error.issues[0];
  const name = String(issue.path[0] ?? 'query');
  const got = name in values ? `, got "${values[name]}"` : '';
  throw new ApiError(
    400,
    'query.invalid',
    `${name}: ${issue.message}${got}. Fix the query parameter or leave it out.`,
    {
      cause: result.error
    }
  );
}

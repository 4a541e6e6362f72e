import type { z } from 'zod';

/** Messages for a form's fields, keyed by field name (`reason`) or dotted path (`tolerances.unitWarning`). */
export type FieldErrors = Record<string, string>;

/**
 * The first message per field of a failed zod parse. Form actions return these with
 * `fail(400, { fieldErrors, values })` and forms show each under its field; pages also run it in
 * the browser for inline checks, so it imports nothing server-only.
 *
 * @example fieldErrorsOf(schema.safeParse({ reason: '' }).error) → { reason: 'Say why…' }
 */
export function fieldErrorsOf(error: z.ZodError): FieldErrors {
  const fieldErrors: FieldErrors = {};
  for (const issue of error.issues) {
    const name = issue.path.length > 0 ? issue.path.map(String).join('.') : 'form';
    fieldErrors[name] ??= issue.message;
  }
  return fieldErrors;
}

/**
 * The `Idempotency-Key` request header of a build upload. It lets a retried or repeated upload be
 * answered from the stored build before its body is read; the key inside the `meta` part stays
 * the one a new build is stored with, so the two must agree when both are sent.
 */
import { ApiError } from './api-error';
import { printableText } from './build-meta';

/** The header's name (lower case, as the Fetch `Headers` class reads it). */
export const IDEMPOTENCY_HEADER = 'idempotency-key';

const keySchema = printableText(200);

/**
 * The header's key, or null when the header is absent.
 * @throws ApiError 400 `upload.idempotency-key-invalid` naming what is wrong with it.
 */
export function parseIdempotencyHeader(value: string | null): string | null {
  if (value === null) return null;
  const result = keySchema.safeParse(value);
  if (result.success) return result.data;
  throw new ApiError(
    400,
    'upload.idempotency-key-invalid',
    `Idempotency-Key: ${result.error.issues[0]?.message ?? 'invalid'}. ` +
      'Send the same key as meta.idempotencyKey, or leave the header out.',
    { cause: result.error }
  );
}

/**
 * The key a new build is stored with: the meta key, or the header's when meta has none.
 * @example agreedIdempotencyKey('ci-77', 'ci-77') → 'ci-77'
 * @example agreedIdempotencyKey('ci-77', null) → 'ci-77'
 * @throws ApiError 400 `upload.idempotency-mismatch` when both are given and differ.
 */
export function agreedIdempotencyKey(headerKey: string | null, metaKey: string | null | undefined): string | null {
  if (headerKey !== null && metaKey != null && headerKey !== metaKey) {
    throw new ApiError(
      400,
      'upload.idempotency-mismatch',
      `Idempotency-Key: the header says "${headerKey}" but meta.idempotencyKey says "${metaKey}". ` +
        'Send the same key in both, or only one of them.'
    );
  }
  return metaKey ?? headerKey;
}

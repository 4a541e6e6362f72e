import { describe, expect, it } from 'vitest';
import { ApiError } from './api-error';
import { agreedIdempotencyKey, parseIdempotencyHeader } from './idempotency-key';

describe('parseIdempotencyHeader', () => {
  it.each([
    { value: null, expected: null },
    { value: 'ci-job-77120', expected: 'ci-job-77120' },
    { value: '  cli1-abc  ', expected: 'cli1-abc' },
    { value: 'k'.repeat(200), expected: 'k'.repeat(200) }
  ])('reads $value as $expected', ({ value, expected }) => {
    expect(parseIdempotencyHeader(value)).toBe(expected);
  });

  it.each([
    { value: '', reason: 'must not be empty' },
    { value: 'k'.repeat(201), reason: 'at most 200 characters' },
    { value: 'ci\u0007job', reason: 'control characters' }
  ])('refuses $reason with 400 upload.idempotency-key-invalid', ({ value, reason }) => {
    const error = captureError(() => parseIdempotencyHeader(value));
    expect(error).toMatchObject({ status: 400, code: 'upload.idempotency-key-invalid' });
    expect(error.message).toContain(reason);
  });
});

describe('agreedIdempotencyKey', () => {
  it.each([
    { header: 'a', meta: 'a', expected: 'a' },
    { header: 'a', meta: null, expected: 'a' },
    { header: 'a', meta: undefined, expected: 'a' },
    { header: null, meta: 'b', expected: 'b' },
    { header: null, meta: null, expected: null }
  ])('keys a new build with $expected for header $header and meta $meta', ({ header, meta, expected }) => {
    expect(agreedIdempotencyKey(header, meta)).toBe(expected);
  });

  it('refuses two different keys with 400 upload.idempotency-mismatch naming both', () => {
    const error = captureError(() => agreedIdempotencyKey('ci-1', 'ci-2'));
    expect(error).toMatchObject({ status: 400, code: 'upload.idempotency-mismatch' });
    expect(error.message).toContain('"ci-1"');
    expect(error.message).toContain('"ci-2"');
  });
});

function captureError(work: () => unknown): ApiError {
  try {
    work();
  } catch (error) {
    if (error instanceof ApiError) return error;
    throw error;
  }
  throw new Error('expected an ApiError');
}

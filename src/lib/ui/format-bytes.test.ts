import { describe, expect, it } from 'vitest';
import { formatBytes } from './format-bytes';

describe('formatBytes', () => {
  // IEC 80000-13 binary prefixes: 1 KiB = 1024 B, 1 MiB = 1024 KiB.
  it.each([
    { byteLength: 0, expected: '0 B' },
    { byteLength: 512, expected: '512 B' },
    { byteLength: 1023, expected: '1023 B' },
    { byteLength: 1024, expected: '1 KiB' },
    { byteLength: 1536, expected: '1.5 KiB' },
    { byteLength: 10 * 1024, expected: '10 KiB' },
    { byteLength: 1024 * 1024 - 20, expected: '1 MiB' },
    { byteLength: 24 * 1024 * 1024 + 300_000, expected: '24 MiB' },
    { byteLength: 3.25 * 1024 ** 3, expected: '3.3 GiB' }
  ])('shows $byteLength bytes as "$expected"', ({ byteLength, expected }) => {
    expect(formatBytes(byteLength)).toBe(expected);
  });

  it('shows a dash for negative or non-finite input', () => {
    expect(formatBytes(-1)).toBe('—');
    expect(formatBytes(Number.NaN)).toBe('—');
  });
});

import { describe, expect, it } from 'vitest';
import { shortSha } from './short-sha';

describe('shortSha', () => {
  it('keeps the first seven characters, git’s default abbreviation (git rev-parse --short)', () => {
    expect(shortSha('3f6a8bc3e21d4c0a9f1e2b3c4d5e6f708192a3b4')).toBe('3f6a8bc');
  });

  it('lower-cases hexadecimal hashes so the same commit always reads the same', () => {
    expect(shortSha('ABCDEF0123456789')).toBe('abcdef0');
  });

  it('accepts a custom length', () => {
    expect(shortSha('3f6a8bc3e21d', 10)).toBe('3f6a8bc3e2');
  });

  it('leaves short or non-hex references as they are, trimmed', () => {
    expect(shortSha('  local ')).toBe('local');
    expect(shortSha('abc')).toBe('abc');
  });
});

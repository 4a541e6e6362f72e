import { describe, expect, it } from 'vitest';
import { plural } from './plural';

describe('plural', () => {
  it.each([
    { count: 0, expected: '0 errors' },
    { count: 1, expected: '1 error' },
    { count: 2, expected: '2 errors' },
    { count: 12_345, expected: '12,345 errors' }
  ])('writes $count as "$expected"', ({ count, expected }) => {
    expect(plural(count, 'error')).toBe(expected);
  });

  it('uses the given plural form', () => {
    expect(plural(2, 'info', 'info')).toBe('2 info');
    expect(plural(3, 'key', 'keys')).toBe('3 keys');
  });
});

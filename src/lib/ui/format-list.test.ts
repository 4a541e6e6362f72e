import { describe, expect, it } from 'vitest';
import { formatList } from './format-list';

describe('formatList', () => {
  it.each([
    { names: [], expected: '' },
    { names: ['Harbour Props'], expected: 'Harbour Props' },
    { names: ['Harbour Props', 'Lighthouse Cinematics'], expected: 'Harbour Props and Lighthouse Cinematics' },
    { names: ['A', 'B', 'C'], expected: 'A, B and C' },
    { names: ['A', 'B', 'C', 'D', 'E'], expected: 'A, B, C and 2 more' }
  ])('lists $names as "$expected"', ({ names, expected }) => {
    expect(formatList(names)).toBe(expected);
  });

  it('honours a smaller limit', () => {
    expect(formatList(['A', 'B', 'C'], 1)).toBe('A and 2 more');
  });
});

import { describe, expect, it } from 'vitest';
import { escapeHtml } from './escape-html';

describe('escapeHtml', () => {
  it.each([
    { input: '<script>alert(1)</script>', expected: '&lt;script&gt;alert(1)&lt;/script&gt;' },
    { input: 'a & b', expected: 'a &amp; b' },
    { input: '"quoted" \'single\'', expected: '&quot;quoted&quot; &#39;single&#39;' },
    { input: '/Diver/Hips', expected: '/Diver/Hips' },
    { input: '&lt;', expected: '&amp;lt;' }
  ])('turns $input into text that shows as typed', ({ input, expected }) => {
    expect(escapeHtml(input)).toBe(expected);
  });
});

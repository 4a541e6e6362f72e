import { describe, expect, it } from 'vitest';
import { shortenForMessage } from './shorten-for-message';

describe('shortenForMessage', () => {
  it.each([
    { text: 'hero.bin', expected: 'hero.bin' },
    { text: 'hero.bin\u0000.png', expected: 'hero.bin\\u0000.png' },
    { text: 'a\nb\u007f', expected: 'a\\u000ab\\u007f' },
    { text: 'x'.repeat(120), expected: 'x'.repeat(120) },
    { text: 'x'.repeat(121), expected: `${'x'.repeat(117)}...` }
  ])('turns $text into $expected', ({ text, expected }) => {
    expect(shortenForMessage(text)).toBe(expected);
  });
});

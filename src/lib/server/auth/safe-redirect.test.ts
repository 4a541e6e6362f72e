import { describe, expect, it } from 'vitest';
import { safeRedirectPath } from './safe-redirect';

describe('safeRedirectPath', () => {
  it.each([
    { value: '/projects/tidewatch-props?branch=main', expected: '/projects/tidewatch-props?branch=main' },
    { value: '/', expected: '/' },
    { value: null, expected: '/' },
    { value: '', expected: '/' },
    { value: 'https://elsewhere.example/', expected: '/' },
    { value: '//elsewhere.example/', expected: '/' },
    { value: '/\\elsewhere.example', expected: '/' },
    { value: 'projects', expected: '/' },
    { value: '/signin?redirectTo=/signin', expected: '/' },
    { value: '/auth/signout', expected: '/' }
  ])('turns $value into $expected', ({ value, expected }) => {
    expect(safeRedirectPath(value)).toBe(expected);
  });
});

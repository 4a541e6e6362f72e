import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { resetConfig } from '../config';
import { checkUserToken, signUserToken, userIdOfToken } from './signed-user-token';

const NOW = new Date('2026-03-02T10:00:00Z');
const IN_AN_HOUR = new Date('2026-03-02T11:00:00Z');

beforeAll(() => {
  process.env.AUTH_SECRET = 'unit-test-secret-that-is-at-least-32-characters';
  resetConfig();
});
afterAll(() => {
  delete process.env.AUTH_SECRET;
  resetConfig();
});

describe('signed user links', () => {
  it('accepts a link before its expiry and names its user', () => {
    const token = signUserToken('unsubscribe', 42, IN_AN_HOUR);
    expect(userIdOfToken(token)).toBe(42);
    expect(checkUserToken('unsubscribe', token, NOW)).toEqual({ status: 'valid', userId: 42, expiresAt: IN_AN_HOUR });
  });

  it('calls a genuine link past its expiry expired, from the second it expires', () => {
    const token = signUserToken('unsubscribe', 42, IN_AN_HOUR);
    expect(checkUserToken('unsubscribe', token, new Date(IN_AN_HOUR.getTime() - 1000)).status).toBe('valid');
    expect(checkUserToken('unsubscribe', token, IN_AN_HOUR).status).toBe('expired');
  });

  it.each([
    { change: 'another user id', edit: (token: string) => token.replace(/^42\./, '43.') },
    {
      change: 'a later expiry',
      edit: (token: string) => token.replace(/\.(\d+)\./, (_, s) => `.${Number(s) + 3600}.`)
    },
    { change: 'a changed signature', edit: (token: string) => token.slice(0, -1) + (token.endsWith('A') ? 'B' : 'A') },
    { change: 'a cut signature', edit: (token: string) => token.slice(0, -2) },
    { change: 'extra text', edit: (token: string) => `${token}x` }
  ])('refuses a link with $change', ({ edit }) => {
    const token = signUserToken('unsubscribe', 42, IN_AN_HOUR);
    expect(checkUserToken('unsubscribe', edit(token), NOW)).toEqual({ status: 'invalid' });
  });

  it('refuses a link signed for another purpose', () => {
    const token = signUserToken('password-reset', 42, IN_AN_HOUR, 'hash-1');
    expect(checkUserToken('unsubscribe', token, NOW).status).toBe('invalid');
  });

  it('refuses a link once its binding changed, which makes reset links one-time', () => {
    const token = signUserToken('password-reset', 42, IN_AN_HOUR, 'hash-before');
    expect(checkUserToken('password-reset', token, NOW, 'hash-before').status).toBe('valid');
    expect(checkUserToken('password-reset', token, NOW, 'hash-after').status).toBe('invalid');
  });

  it('refuses a link signed under another secret', () => {
    const token = signUserToken('unsubscribe', 42, IN_AN_HOUR);
    process.env.AUTH_SECRET = 'another-secret-that-is-also-32-characters-long';
    resetConfig();
    try {
      expect(checkUserToken('unsubscribe', token, NOW).status).toBe('invalid');
    } finally {
      process.env.AUTH_SECRET = 'unit-test-secret-that-is-at-least-32-characters';
      resetConfig();
    }
  });
});

import { describe, expect, it } from 'vitest';
import { isForbiddenCrossSiteForm } from './form-origin-guard';

const ORIGIN = 'https://orientry.example';

function check(path: string, init: { method?: string; contentType?: string; origin?: string | null }): boolean {
  const headers = new Headers();
  if (init.contentType) headers.set('content-type', init.contentType);
  if (init.origin) headers.set('origin', init.origin);
  const url = new URL(path, ORIGIN);
  return isForbiddenCrossSiteForm(new Request(url, { method: init.method ?? 'POST', headers }), url);
}

describe('form origin guard', () => {
  it.each([
    { path: '/signin', init: { contentType: 'application/x-www-form-urlencoded', origin: 'https://evil.example' } },
    { path: '/profile?/password', init: { contentType: 'multipart/form-data; boundary=x', origin: null } },
    { path: '/reset', init: { contentType: 'text/plain', origin: 'null' } },
    { path: '/unsubscribe/3.1900000000.sig?/other', init: { contentType: 'application/x-www-form-urlencoded' } },
    { path: '/unsubscribe/3.1900000000.sig', init: { method: 'DELETE', contentType: 'text/plain' } }
  ])('refuses a cross-site form to $path', ({ path, init }) => {
    expect(check(path, init)).toBe(true);
  });

  it.each([
    { path: '/signin', init: { contentType: 'application/x-www-form-urlencoded', origin: ORIGIN } },
    { path: '/api/v1/projects/reef/tokens', init: { contentType: 'application/json', origin: null } },
    { path: '/signin', init: { method: 'GET', origin: 'https://evil.example' } },
    // RFC 8058 §3.1: the mail provider's POST, no Origin; the token in the path is the credential.
    { path: '/unsubscribe/3.1900000000.sig', init: { contentType: 'application/x-www-form-urlencoded', origin: null } },
    { path: '/unsubscribe/3.1900000000.sig', init: { contentType: 'multipart/form-data; boundary=x' } }
  ])('lets $path through', ({ path, init }) => {
    expect(check(path, init)).toBe(false);
  });
});

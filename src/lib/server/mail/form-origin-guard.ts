/**
 * SvelteKit's cross-site form check, with one exception: the one-click unsubscribe POST of
 * RFC 8058. A mail provider sends that request from its own servers, with no Origin header, so
 * SvelteKit's built-in check (which runs before any hook) refuses it with 403. With the built-in
 * check turned off in svelte.config.js (`csrf: { trustedOrigins: ['*'] }`), this handle, first in
 * the hook sequence, refuses the same requests it did, except POSTs to `/unsubscribe/<token>`:
 * there the signed token is the credential, so a forged request without it can do nothing.
 * While the built-in check is on, this handle only repeats it.
 */
import { json, text, type Handle } from '@sveltejs/kit';

/** Content types a plain HTML form can send cross-site (the ones SvelteKit guards). */
const FORM_CONTENT_TYPES = ['application/x-www-form-urlencoded', 'multipart/form-data', 'text/plain'];
const GUARDED_METHODS = ['POST', 'PUT', 'PATCH', 'DELETE'];

/** True for a cross-site form submission this app must refuse. */
export function isForbiddenCrossSiteForm(request: Request, url: URL): boolean {
  const contentType = (request.headers.get('content-type') ?? '').split(';')[0].trim().toLowerCase();
  if (!GUARDED_METHODS.includes(request.method) || !FORM_CONTENT_TYPES.includes(contentType)) return false;
  if (request.headers.get('origin') === url.origin) return false;
  const isOneClickUnsubscribe =
    request.method === 'POST' && /^\/unsubscribe\/[^/]+$/.test(url.pathname) && url.search === '';
  return !isOneClickUnsubscribe;
}

/** Refuses cross-site form submissions (403) except the one-click unsubscribe; see the file comment. */
export const formOriginGuard: Handle = async ({ event, resolve }) => {
  if (isForbiddenCrossSiteForm(event.request, event.url)) {
    const message = `Cross-site ${event.request.method} form submissions are forbidden`;
    return event.request.headers.get('accept') === 'application/json'
      ? json({ message }, { status: 403 })
      : text(message, { status: 403 });
  }
  return resolve(event);
};

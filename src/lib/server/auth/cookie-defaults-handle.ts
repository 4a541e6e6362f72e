import type { Handle } from '@sveltejs/kit';

/**
 * Marks cookies `secure` exactly when the site is served over HTTPS. SvelteKit's own default is
 * secure everywhere except http://localhost, and Auth.js leaves the flag out when it refreshes a
 * session; on plain http under any other host name the browser would then drop the refreshed
 * cookie. Runs before the Auth.js handle.
 */
export const cookieDefaultsHandle: Handle = async ({ event, resolve }) => {
  const isHttps = event.url.protocol === 'https:';
  const set = event.cookies.set.bind(event.cookies);
  event.cookies.set = (name, value, options) => set(name, value, { ...options, secure: options.secure ?? isHttps });
  return resolve(event);
};

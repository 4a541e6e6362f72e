import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/** @type {import('@sveltejs/kit').Config} */
const config = {
  preprocess: vitePreprocess(),
  kit: {
    adapter: adapter(),
    // SvelteKit's built-in cross-site form check runs before any hook and refuses a request with
    // no Origin header, which is exactly what a mail provider's RFC 8058 one-click unsubscribe is.
    // src/lib/server/mail/form-origin-guard.ts, first in the hook sequence, makes the same check
    // for every other request (tests/integration/security-*.test.ts cover both).
    csrf: { checkOrigin: false }
  }
};

export default config;

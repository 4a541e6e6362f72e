import type { Handle, HandleServerError, ServerInit } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { building, dev } from '$app/environment';
import { authHandle } from '$lib/server/auth/auth-js';
import { cookieDefaultsHandle } from '$lib/server/auth/cookie-defaults-handle';
import { credentialsCallbackGuard } from '$lib/server/auth/credentials-callback-guard';
import { signInRequiredHandle } from '$lib/server/auth/sign-in-required-handle';
import { userHandle } from '$lib/server/auth/user-handle';
import { closeDatabase } from '$lib/server/db/instance';
import { ConfigError } from '$lib/server/errors';
import { formOriginGuard } from '$lib/server/mail/form-origin-guard';
import { allowMailLinkPaths } from '$lib/server/mail/mail-link-paths';
import { startMailService, stopMailService } from '$lib/server/mail/mail-service';
import { prepareServer } from '$lib/server/startup';
import { tokenFailureGuard } from '$lib/server/tokens/token-failure-guard';

/**
 * Runs once before the server takes requests: checks configuration and the data folder,
 * opens the database and applies pending migrations. A setup problem prints one line saying
 * what to fix and stops the process (the development server keeps running and shows it).
 */
export const init: ServerInit = async () => {
  if (building) return;
  try {
    const applied = await prepareServer();
    if (applied.length > 0) console.log(`Orientry: applied database migrations ${applied.join(', ')}`);
    const mail = await startMailService();
    console.log(`Orientry mail: ${mail.description}`);
    // adapter-node emits this on SIGTERM/SIGINT once requests have drained: stop mail, close SQLite cleanly.
    process.once(
      'sveltekit:shutdown',
      () =>
        void stopMailService()
          .then(closeDatabase)
          .catch((error) => console.error(error))
    );
  } catch (error) {
    if (error instanceof ConfigError && !dev) {
      console.error(error.message);
      // Top-level start-up handler: the message already says what to fix, a stack trace would bury it.
      process.exit(1);
    }
    throw error;
  }
};

/**
 * Cross-site form check (one-click unsubscribe passes), the refused-token brake, cookie defaults, sign-in rate
 * limit, then Auth.js (`/auth/*`, `locals.auth`), then `locals.user`, then the sign-in wall (mail links pass).
 */
export const handle: Handle = sequence(
  formOriginGuard,
  tokenFailureGuard,
  cookieDefaultsHandle,
  credentialsCallbackGuard,
  authHandle,
  userHandle,
  allowMailLinkPaths(signInRequiredHandle)
);

/**
 * Unexpected errors: logged with an id and the stack, answered with a generic line that
 * carries the same id. Expected failures never get here (routes throw `error(status, …)`).
 */
export const handleError: HandleServerError = ({ error, event, status }) => {
  if (status === 404) return { message: 'Not found.', code: 'not-found' };
  const errorId = crypto.randomUUID().slice(0, 8);
  console.error(`Orientry error ${errorId} on ${event.request.method} ${event.url.pathname}:`, error);
  return {
    message: `Something went wrong on our side (error ${errorId}). Try again; if it keeps happening, tell an admin the error id.`,
    code: 'internal',
    errorId
  };
};

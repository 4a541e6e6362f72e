/**
 * Auth.js wiring: e-mail and password (Credentials provider over the users table), sessions
 * as signed JWTs in an http-only, same-site cookie (marked secure when the site is served over
 * HTTPS). Only the server hook and the sign-in route import this file: it pulls in SvelteKit's
 * runtime modules, so scripts must not.
 */
import { CredentialsSignin, SvelteKitAuth, type SvelteKitAuthConfig } from '@auth/sveltekit';
import Credentials from '@auth/sveltekit/providers/credentials';
import { z } from 'zod';
import { getConfig } from '../config';
import { resolveAuthSecret } from './auth-secret';
import { verifyCredentials } from './credentials';

/** How long a session lasts without activity. */
const SESSION_MAX_AGE_SECONDS = 30 * 24 * 60 * 60;

const credentialsSchema = z.object({ email: z.string().trim().min(1).max(320), password: z.string().min(1).max(1000) });

let config: SvelteKitAuthConfig | undefined;

/** Built on first use, after start-up has validated the configuration and made the secret. */
function authConfig(): SvelteKitAuthConfig {
  config ??= {
    providers: [
      Credentials({
        credentials: { email: { label: 'E-mail', type: 'email' }, password: { label: 'Password', type: 'password' } },
        async authorize(credentials) {
          const parsed = credentialsSchema.safeParse(credentials);
          if (!parsed.success) return null;
          const user = await verifyCredentials(parsed.data.email, parsed.data.password);
          return user ? { id: String(user.id), email: user.email, name: user.name } : null;
        }
      })
    ],
    session: { strategy: 'jwt', maxAge: SESSION_MAX_AGE_SECONDS },
    secret: resolveAuthSecret(getConfig()),
    // adapter-node sits behind whatever proxy the operator runs; ORIGIN pins the public URL.
    trustHost: true,
    pages: { signIn: '/signin', error: '/signin' },
    callbacks: {
      session({ session, token }) {
        if (token.sub) session.user.id = token.sub;
        return session;
      }
    },
    logger: {
      error(error) {
        // A wrong password is an expected outcome, counted by the limiter, not a server error.
        if (error instanceof CredentialsSignin || (error as { type?: string }).type === 'CredentialsSignin') return;
        console.error('auth:', error);
      },
      warn(code) {
        console.warn(`auth: ${code}`);
      }
    }
  };
  return config;
}

/**
 * The Auth.js pieces: `handle` serves `/auth/*` and gives `locals.auth()`, `signIn` and
 * `signOut` are form actions that read provider and fields from the posted form.
 */
export const { handle: authHandle, signIn: authSignIn, signOut: authSignOut } = SvelteKitAuth(async () => authConfig());

/**
 * The browser session and form posts on a real server: the session cookie is http-only and
 * same-site everywhere, and secure exactly when the site is served over HTTPS (ORIGIN https, or
 * `X-Forwarded-Proto: https` behind a proxy configured with PROTOCOL_HEADER); form posts from
 * another origin are refused with 403 before they do anything; sign-in is rate-limited through
 * the form and through Auth.js's own callback alike (5 failures per e-mail and address, the
 * default of SIGNIN_MAX_FAILURES).
 *
 * The HTTPS servers are extra processes started from the test server's own build copy, on the
 * same data folder and database.
 */
import type { ChildProcess } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ProjectPolicy } from '$lib/server/db/models';
import { diverGlb } from './api-fixtures';
import {
  seedProject,
  seedUser,
  signIn,
  startApiTestServer,
  type ApiTestServer,
  type SeededUser
} from './api-test-server';
import { freePort, launchServer } from './helpers/server-process';

const PUBLIC_HTTPS_ORIGIN = 'https://orientry.lanternfish.example';
const ELSEWHERE = 'https://elsewhere.example';

let server: ApiTestServer;
let secret: string;
let lead: SeededUser;
const siblings: ChildProcess[] = [];

/**
 * Starts another server process from the test server's build copy on the same data, with `env`
 * instead of the test server's ORIGIN. Returns its loopback URL.
 */
async function startSibling(env: Record<string, string>): Promise<string> {
  const url = `http://127.0.0.1:${await freePort()}`;
  const base = { ...process.env };
  delete base.ORIGIN;
  const child = await launchServer({
    buildDir: server.child.spawnargs[1],
    url,
    env: {
      ...base,
      NODE_ENV: 'production',
      AUTH_SECRET: 'api-test-secret-that-is-at-least-32-characters-long',
      DATA_DIR: server.dataDir,
      DATABASE_URL: server.databaseUrl,
      PORT: new URL(url).port,
      HOST: '127.0.0.1',
      ...env
    }
  });
  siblings.push(child);
  return url;
}

/** Posts the sign-in form to `url` with `headers` and returns the raw answer (redirects not followed). */
async function postSignIn(url: string, user: SeededUser, headers: Record<string, string>, password = user.password) {
  return fetch(`${url}/signin`, {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded', ...headers },
    body: new URLSearchParams({ email: user.email, password, redirectTo: '/' })
  });
}

/**
 * The status a form action answered with: SvelteKit answers a failed action posted by a script
 * (Accept other than text/html) as JSON `{ type: 'failure', status }` with HTTP 200.
 */
async function actionStatus(response: Response): Promise<number> {
  if (!(response.headers.get('content-type') ?? '').includes('application/json')) return response.status;
  const body = (await response.json()) as { type?: string; status?: number };
  return body.type === 'failure' && body.status ? body.status : response.status;
}

/** The Set-Cookie line of the session cookie, attributes lower-cased. */
function sessionCookieOf(response: Response): string {
  const line = response.headers.getSetCookie().find((cookie) => /session-token=[^;]/.test(cookie));
  if (!line) throw new Error(`No session cookie in ${response.status}: ${response.headers.getSetCookie().join(' | ')}`);
  return line.toLowerCase();
}

beforeAll(async () => {
  server = await startApiTestServer();
  lead = await seedUser('harbourmaster@lanternfish.example', 'lead');
  ({ secret } = await seedProject('lantern-quay', [{ user: lead, role: 'lead' }]));
}, 240_000);

afterAll(async () => {
  for (const child of siblings) {
    if (child.exitCode === null && child.signalCode === null) {
      const exited = new Promise((resolve) => child.once('exit', resolve));
      child.kill('SIGTERM');
      await exited;
    }
  }
  await server?.remove();
});

describe('the session cookie', () => {
  it('is http-only and same-site, and not secure on plain http (the browser would drop it)', async () => {
    const cookie = sessionCookieOf(await postSignIn(server.url, lead, { origin: server.url }));
    expect(cookie).toContain('httponly');
    expect(cookie).toMatch(/samesite=(lax|strict)/);
    expect(cookie).toContain('path=/');
    expect(cookie).not.toMatch(/;\s*secure/);
  });

  it('is also secure when ORIGIN is https', async () => {
    const url = await startSibling({ ORIGIN: PUBLIC_HTTPS_ORIGIN });
    const cookie = sessionCookieOf(await postSignIn(url, lead, { origin: PUBLIC_HTTPS_ORIGIN }));
    expect(cookie).toContain('httponly');
    expect(cookie).toMatch(/samesite=(lax|strict)/);
    expect(cookie).toMatch(/;\s*secure/);
  });

  it('is secure behind a proxy that says X-Forwarded-Proto: https, and only then', async () => {
    const url = await startSibling({ PROTOCOL_HEADER: 'x-forwarded-proto', HOST_HEADER: 'x-forwarded-host' });
    const host = new URL(PUBLIC_HTTPS_ORIGIN).host;
    const behindHttps = await postSignIn(url, lead, {
      origin: PUBLIC_HTTPS_ORIGIN,
      'x-forwarded-proto': 'https',
      'x-forwarded-host': host
    });
    const cookie = sessionCookieOf(behindHttps);
    expect(cookie).toContain('httponly');
    expect(cookie).toMatch(/samesite=(lax|strict)/);
    expect(cookie).toMatch(/;\s*secure/);
    const plain = await postSignIn(url, lead, {
      origin: `http://${host}`,
      'x-forwarded-proto': 'http',
      'x-forwarded-host': host
    });
    expect(sessionCookieOf(plain)).not.toMatch(/;\s*secure/);
  });
});

describe('form posts from another origin', () => {
  it.each([
    { what: 'from another site', origin: ELSEWHERE },
    { what: 'with no Origin header', origin: null },
    { what: 'from the same host on another scheme', origin: 'https://127.0.0.1' }
  ])('refuses a sign-in post $what with 403', async ({ origin }) => {
    const response = await postSignIn(server.url, lead, origin ? { origin } : {});
    expect(response.status).toBe(403);
    expect(response.headers.getSetCookie().some((cookie) => cookie.includes('session-token='))).toBe(false);
  });

  it('refuses a cross-site post straight to Auth.js’s credentials callback (no sign-in by a forged form)', async () => {
    // Auth.js under SvelteKit skips its own CSRF token and relies on this origin check.
    const response = await fetch(`${server.url}/auth/callback/credentials`, {
      method: 'POST',
      redirect: 'manual',
      headers: { origin: ELSEWHERE, 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams({ email: lead.email, password: lead.password })
    });
    expect(response.status).toBe(403);
    expect(response.headers.getSetCookie().some((cookie) => /session-token=[^;]/.test(cookie))).toBe(false);
  });

  it('refuses a signed-in lead’s policy form posted from another site, and saves nothing', async () => {
    const cookie = await signIn(server, lead);
    const revisionsBefore = await ProjectPolicy.count();
    const response = await fetch(`${server.url}/projects/lantern-quay/settings?/savePolicy`, {
      method: 'POST',
      redirect: 'manual',
      headers: { cookie, origin: ELSEWHERE, 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams({ 'gate.failOn': 'info' })
    });
    expect(response.status).toBe(403);
    expect(await ProjectPolicy.count()).toBe(revisionsBefore);
  });

  it('refuses a cross-site text/plain post to the session API, and a cross-site sign-out', async () => {
    const cookie = await signIn(server, lead);
    const tokens = await fetch(`${server.url}/api/v1/projects/lantern-quay/tokens`, {
      method: 'POST',
      headers: { cookie, origin: ELSEWHERE, 'content-type': 'text/plain' },
      body: JSON.stringify({ name: 'planted by another site' })
    });
    expect(tokens.status).toBe(403);
    const signOut = await fetch(`${server.url}/signout`, {
      method: 'POST',
      redirect: 'manual',
      headers: { cookie, origin: ELSEWHERE, 'content-type': 'application/x-www-form-urlencoded' },
      body: ''
    });
    expect(signOut.status).toBe(403);
  });

  it('refuses a multipart build upload from another origin even with a valid token', async () => {
    const form = new FormData();
    form.append('meta', JSON.stringify({ branch: 'main' }));
    form.append('file', new Blob([(await diverGlb()) as BlobPart]), 'chars/diver.glb');
    const response = await fetch(`${server.url}/api/v1/projects/lantern-quay/builds`, {
      method: 'POST',
      body: form,
      headers: { authorization: `Bearer ${secret}`, origin: ELSEWHERE }
    });
    expect(response.status).toBe(403);
  });

  it('lets the same form through from the site itself (the refusals are about origin)', async () => {
    const response = await postSignIn(server.url, lead, { origin: server.url }, 'not the password');
    expect(await actionStatus(response)).toBe(400);
  });
});

describe('sign-in rate limits', () => {
  it('refuses the sixth attempt through the form with 429, even with the right password', async () => {
    const deckhand = await seedUser('deckhand@lanternfish.example', 'artist');
    for (let attempt = 0; attempt < 5; attempt++) {
      const refused = await postSignIn(server.url, deckhand, { origin: server.url }, `guess ${attempt}`);
      expect(await actionStatus(refused)).toBe(400);
    }
    const blocked = await postSignIn(server.url, deckhand, { origin: server.url });
    expect(await actionStatus(blocked)).toBe(429);
    expect(blocked.headers.getSetCookie().some((cookie) => /session-token=[^;]/.test(cookie))).toBe(false);
  });

  it('refuses the sixth attempt through Auth.js’s own callback with 429 and Retry-After', async () => {
    const lookout = await seedUser('lookout@lanternfish.example', 'viewer');
    const attempt = async (password: string) =>
      fetch(`${server.url}/auth/callback/credentials`, {
        method: 'POST',
        redirect: 'manual',
        headers: { origin: server.url, 'content-type': 'application/x-www-form-urlencoded' },
        body: new URLSearchParams({ email: lookout.email, password })
      });
    for (let index = 0; index < 5; index++) {
      const refused = await attempt(`guess ${index}`);
      expect(refused.headers.get('location')).toContain('error=CredentialsSignin');
    }
    const blocked = await attempt(lookout.password);
    expect(blocked.status).toBe(429);
    // The window is SIGNIN_WINDOW_MINUTES (default 15 minutes).
    const retryAfter = Number(blocked.headers.get('retry-after'));
    expect(retryAfter).toBeGreaterThan(0);
    expect(retryAfter).toBeLessThanOrEqual(15 * 60);
  });
});

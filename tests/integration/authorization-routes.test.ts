/**
 * Who may reach what: every page, form action and API endpoint under src/routes, requested by
 * each kind of caller against the real server, with the status each must get. The table below is
 * the one place the answers live; the first test fails when a route, method or action exists on
 * disk without a row (or a row names one that is gone), so a new route cannot ship unreviewed.
 *
 * Callers: anonymous; an outsider (signed in, member of no project); the viewer, artist and lead of
 * the project under test; and a site admin who is a member of nothing. Form actions are posted with
 * an empty form: a caller who may use the action gets the action's own 400 (nothing is changed),
 * everyone else the guard's 303/403/404.
 */
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Asset, User } from '$lib/server/db/models';
import * as invitations from '$lib/server/invitations/invitations';
import { proposeWaiverSchema } from '$lib/server/waivers/waiver-input';
import * as waivers from '$lib/server/waivers/waivers';
import * as apiTokens from '$lib/server/tokens/api-tokens';
import { isProjectRoleAtLeast, type ProjectRole } from '$lib/types/roles';
import { diverGlb } from './api-fixtures';
import {
  postBuild,
  seedProject,
  seedUser,
  signIn,
  startApiTestServer,
  type ApiTestServer,
  type SeededUser
} from './api-test-server';

const CALLERS = ['anonymous', 'outsider', 'viewer', 'artist', 'lead', 'admin'] as const;
type Caller = (typeof CALLERS)[number];
type Expected = Record<Caller, number>;

/** Signed-in pages send anonymous visitors to /signin (303) before any route code runs. */
const SIGN_IN_REDIRECT = 303;

function everyone(status: number): Expected {
  return { anonymous: status, outsider: status, viewer: status, artist: status, lead: status, admin: status };
}

/** Any signed-in user gets `status`; anonymous visitors go to sign-in (or `anonymous`). */
function signedIn(status: number, anonymous = SIGN_IN_REDIRECT): Expected {
  return { ...everyone(status), anonymous };
}

/**
 * A project route needing `minimum`: members below it get 403, non-members 404 (the project's
 * existence is not revealed), admins count as leads; anonymous gets `anonymous`.
 */
function project(minimum: ProjectRole, allowed: number, anonymous: number): Expected {
  const status = (role: ProjectRole) => (isProjectRoleAtLeast(role, minimum) ? allowed : 403);
  return {
    anonymous,
    outsider: 404,
    viewer: status('viewer'),
    artist: status('artist'),
    lead: status('lead'),
    admin: allowed
  };
}
const projectPage = (minimum: ProjectRole, allowed = 200) => project(minimum, allowed, SIGN_IN_REDIRECT);
/** The JSON API answers 401 instead of redirecting. */
const projectApi = (minimum: ProjectRole, allowed = 200) => project(minimum, allowed, 401);

/** Site admins only. */
function adminOnly(allowed: number, anonymous = SIGN_IN_REDIRECT): Expected {
  return { ...everyone(403), anonymous, admin: allowed };
}

/**
 * Every route, method and form action with the status each caller gets. Keys are
 * `METHOD /route/id` (SvelteKit route ids), plus `?/action` for form actions (`?/default` for a default action).
 */
const TABLE: Record<string, Expected> = {
  'GET /': signedIn(200),
  'GET /design': signedIn(200),
  'GET /profile': signedIn(200),
  'POST /profile?/password': signedIn(400),
  'POST /profile?/mail': signedIn(400),
  'GET /signin': { ...signedIn(303), anonymous: 200 },
  // An empty sign-in form fails (400); a signed-in visitor is then sent on by the page's load.
  'POST /signin?/default': { ...signedIn(303), anonymous: 400 },
  // Auth.js answers the sign-out with its own redirect to /signin.
  'POST /signout': everyone(302),
  'GET /reset': everyone(200),
  'POST /reset?/default': everyone(400),
  'GET /reset/[token]': everyone(200),
  'POST /reset/[token]?/default': everyone(400),
  'GET /unsubscribe/[token]': everyone(200),
  'POST /unsubscribe/[token]?/default': everyone(400),
  'GET /invite/[token]': everyone(200),
  'POST /invite/[token]?/default': everyone(400),
  'GET /cli/orientry.js': everyone(200),
  'GET /check': { anonymous: SIGN_IN_REDIRECT, outsider: 403, viewer: 403, artist: 200, lead: 200, admin: 200 },

  'GET /admin': adminOnly(303),
  'GET /admin/users': adminOnly(200),
  'POST /admin/users?/invite': adminOnly(400),
  'POST /admin/users?/withdraw': adminOnly(400),
  'POST /admin/users?/setDisabled': adminOnly(400),
  'POST /admin/users?/changeRole': adminOnly(400),
  'GET /admin/outbox': adminOnly(200),
  'POST /admin/outbox?/retry': adminOnly(400),
  // No such message: the admin guard answers first, then the look-up's 404.
  'GET /admin/outbox/caught/[id]': adminOnly(404),
  'GET /admin/outbox/messages/[id]': adminOnly(404),

  'GET /projects/[project]': projectPage('viewer'),
  'GET /projects/[project]/builds/[id]': projectPage('viewer'),
  'GET /projects/[project]/builds/[id]/assets/[assetId]': projectPage('viewer'),
  'GET /projects/[project]/builds/[id]/assets/[assetId]/fixed': projectPage('artist'),
  'GET /projects/[project]/trends': projectPage('viewer'),
  'GET /projects/[project]/waivers': projectPage('viewer'),
  'POST /projects/[project]/waivers?/propose': projectPage('artist', 400),
  'POST /projects/[project]/waivers?/decide': projectPage('lead', 400),
  'GET /projects/[project]/settings': projectPage('lead'),
  'POST /projects/[project]/settings?/savePolicy': projectPage('lead', 400),
  'POST /projects/[project]/settings?/setBaseBranch': projectPage('lead', 400),
  'POST /projects/[project]/settings?/createToken': projectPage('lead', 400),
  'POST /projects/[project]/settings?/revokeToken': projectPage('lead', 400),
  'POST /projects/[project]/settings?/addMember': projectPage('lead', 400),
  'POST /projects/[project]/settings?/changeRole': projectPage('lead', 400),
  'POST /projects/[project]/settings?/removeMember': projectPage('lead', 400),

  'GET /api/health': everyone(200),
  // Builds are submitted with a project token only; a session is not enough.
  'POST /api/v1/projects/[project]/builds': everyone(401),
  'GET /api/v1/projects/[project]/builds': projectApi('viewer'),
  'GET /api/v1/projects/[project]/builds/[id]': projectApi('viewer'),
  'GET /api/v1/projects/[project]/builds/[id]/findings': projectApi('viewer'),
  'GET /api/v1/projects/[project]/builds/[id]/assets/[assetId]/channels': projectApi('viewer'),
  'GET /api/v1/projects/[project]/builds/[id]/report.[format]': projectApi('viewer'),
  'GET /api/v1/projects/[project]/trends': projectApi('viewer'),
  'GET /api/v1/projects/[project]/waivers': projectApi('viewer'),
  'POST /api/v1/projects/[project]/waivers': projectApi('artist', 400),
  'GET /api/v1/projects/[project]/waivers/[id]': projectApi('viewer'),
  'POST /api/v1/projects/[project]/waivers/[id]/decision': projectApi('lead', 400),
  'GET /api/v1/projects/[project]/policy': projectApi('lead'),
  'PUT /api/v1/projects/[project]/policy': projectApi('lead', 400),
  'GET /api/v1/projects/[project]/tokens': projectApi('lead'),
  'POST /api/v1/projects/[project]/tokens': projectApi('lead', 400),
  // Revoking an already revoked token answers 200 again, so lead and admin both get 200.
  'DELETE /api/v1/projects/[project]/tokens/[id]': projectApi('lead')
};

const ROUTES_DIR = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..', 'src', 'routes');
const METHOD_PATTERN =
  /export\s+(?:const|async\s+function|function)\s+(GET|POST|PUT|PATCH|DELETE|OPTIONS|HEAD|fallback)\b/g;

/** Every `METHOD /route` and `POST /route?/action` the route files on disk define. */
function routesOnDisk(): string[] {
  const keys: string[] = [];
  const walk = (folder: string) => {
    for (const entry of fs.readdirSync(folder, { withFileTypes: true })) {
      if (entry.isDirectory()) walk(path.join(folder, entry.name));
    }
    const names = fs.readdirSync(folder);
    const relative = path.relative(ROUTES_DIR, folder).split(path.sep).join('/');
    const routeId = `/${relative.replace(/(^|\/)\([^/]+\)/g, '')}`.replace(/\/$/, '') || '/';
    if (names.includes('+page.svelte')) keys.push(`GET ${routeId}`);
    if (names.includes('+server.ts')) {
      const text = fs.readFileSync(path.join(folder, '+server.ts'), 'utf8');
      for (const match of text.matchAll(METHOD_PATTERN)) keys.push(`${match[1]} ${routeId}`);
    }
    if (names.includes('+page.server.ts')) {
      const text = fs.readFileSync(path.join(folder, '+page.server.ts'), 'utf8');
      // The actions object runs from its export to the first closing brace at the start of a line.
      const actions = text.split(/export\s+const\s+actions\b/)[1]?.split(/\n\};?/)[0];
      // Action names are the keys at the first indent level of the exported object.
      for (const match of actions?.matchAll(/^ {2}(\w+)\s*[:(,]/gm) ?? []) keys.push(`POST ${routeId}?/${match[1]}`);
    }
  };
  walk(ROUTES_DIR);
  return keys.sort();
}

describe('the authorization table', () => {
  it('has exactly one row for every route, method and form action on disk', () => {
    const onDisk = routesOnDisk();
    const missing = onDisk.filter((key) => !(key in TABLE));
    const stale = Object.keys(TABLE).filter((key) => !onDisk.includes(key));
    expect({ missing, stale }).toEqual({ missing: [], stale: [] });
  });
});

let server: ApiTestServer;
const cookies = {} as Record<Caller, string | null>;
const params: Record<string, string> = {};
/** Route ids whose `[id]` is not a build's. */
const ID_PARAM: Record<string, string> = {};

beforeAll(async () => {
  server = await startApiTestServer();
  const people = {} as Record<Exclude<Caller, 'anonymous'>, SeededUser>;
  people.admin = await seedUser('ada.sweep@lanternfish.example', 'admin');
  people.lead = await seedUser('lena.sweep@lanternfish.example', 'lead');
  people.artist = await seedUser('arlo.sweep@lanternfish.example', 'artist');
  people.viewer = await seedUser('vera.sweep@lanternfish.example', 'viewer');
  people.outsider = await seedUser('otto.sweep@lanternfish.example', 'artist');
  const seeded = await seedProject('sweep', [
    { user: people.lead, role: 'lead' },
    { user: people.artist, role: 'artist' },
    { user: people.viewer, role: 'viewer' }
  ]);
  const response = await postBuild(server, 'sweep', seeded.secret, [
    { path: 'chars/kelp-diver.glb', bytes: await diverGlb({ defect: 'zero-key' }) }
  ]);
  expect(response.status, await response.clone().text()).toBe(201);
  const buildId = ((await response.json()) as { build: { id: number } }).build.id;
  const asset = await Asset.findOne({ where: { buildId } });
  const leadUser = await User.findByPk(people.lead.id);
  const waiver = await waivers.propose(
    seeded.project,
    { user: { id: leadUser!.id, email: leadUser!.email, name: leadUser!.name, role: leadUser!.role }, role: 'lead' },
    proposeWaiverSchema.parse({ scope: 'fingerprint', fingerprint: '0123456789abcdef', reason: 'Sweep fixture.' })
  );
  const spareToken = await apiTokens.create(seeded.project.id, 'Sweep spare', null);
  const invitation = await invitations.create(
    { email: 'ines.sweep@lanternfish.example', role: 'viewer' },
    people.admin.id
  );

  Object.assign(params, {
    project: 'sweep',
    id: String(buildId),
    assetId: String(asset!.id),
    format: 'json',
    token: invitation.token
  });
  Object.assign(ID_PARAM, {
    '/api/v1/projects/[project]/tokens/[id]': String(spareToken.id),
    '/api/v1/projects/[project]/waivers/[id]': String(waiver.id),
    '/api/v1/projects/[project]/waivers/[id]/decision': String(waiver.id),
    '/admin/outbox/caught/[id]': '999999',
    '/admin/outbox/messages/[id]': '999999',
    '/reset/[token]': 'not-a-reset-token',
    '/unsubscribe/[token]': 'not-an-unsubscribe-token'
  });
  cookies.anonymous = null;
  for (const caller of CALLERS) if (caller !== 'anonymous') cookies[caller] = await signIn(server, people[caller]);
});
afterAll(async () => server?.remove());

/** The URL path of a route id with this sweep's parameters filled in. */
function pathOf(routeId: string): string {
  return routeId.replace(/\[(\w+)\]/g, (_, name: string) => {
    if (name === 'id' || name === 'token') return ID_PARAM[routeId] ?? params[name];
    return params[name];
  });
}

async function request(key: string, caller: Caller): Promise<Response> {
  const [method, target] = key.split(' ');
  const [routeId, action] = target.split('?/');
  const isApi = routeId.startsWith('/api/');
  const headers: Record<string, string> = { origin: server.url };
  if (cookies[caller]) headers.cookie = cookies[caller]!;
  let body: string | undefined;
  if (action !== undefined) {
    headers['content-type'] = 'application/x-www-form-urlencoded';
    headers.accept = 'text/html';
    body = '';
  } else if (isApi && method !== 'GET' && method !== 'DELETE') {
    headers['content-type'] = 'application/json';
    body = '{}';
  } else if (method === 'POST') {
    headers['content-type'] = 'application/x-www-form-urlencoded';
    body = '';
  }
  const url = `${server.url}${pathOf(routeId)}${action !== undefined && action !== 'default' ? `?/${action}` : ''}`;
  const response = await fetch(url, { method, headers, body, redirect: 'manual' });
  await response.arrayBuffer();
  return response;
}

describe('every route answers every caller as the table says', () => {
  it.each(Object.keys(TABLE))('%s', async (key) => {
    const actual = {} as Expected;
    for (const caller of CALLERS) actual[caller] = (await request(key, caller)).status;
    expect(actual).toEqual(TABLE[key]);
  });
});

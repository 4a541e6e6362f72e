/**
 * Waivers through the real server and the real ingestion: proposed and decided over the JSON API
 * by people of each role, then applied (or not) by the gate when the next build is stored.
 * Builds go to a feature branch, whose baseline is the clean base-branch build, so the defect is
 * `new` every time and only a waiver can let it pass.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Waiver } from '$lib/server/db/models';
import { diverGlb } from './api-fixtures';
import {
  postBuild,
  seedProject,
  seedUser,
  signIn,
  startApiTestServer,
  type ApiTestServer,
  type BuildAnswer
} from './api-test-server';

interface FindingAnswer {
  findings: {
    fingerprint: string;
    rule: string;
    asset: string;
    severity: string;
    waived: boolean;
    waiverId: number | null;
  }[];
}

let server: ApiTestServer;
let secret: string;
const cookie = {} as Record<'lead' | 'artist' | 'viewer', string>;
let blockingFinding: FindingAnswer['findings'][number];

async function api(who: keyof typeof cookie, method: string, path: string, body?: unknown): Promise<Response> {
  return fetch(`${server.url}/api/v1/projects/reef/${path}`, {
    method,
    headers: {
      cookie: cookie[who],
      origin: server.url,
      ...(body === undefined ? {} : { 'content-type': 'application/json' })
    },
    body: body === undefined ? undefined : JSON.stringify(body)
  });
}

/** Posts the diver with its zero-length key (an error by default) to the feature branch. */
async function postDefectiveBuild(label: string): Promise<BuildAnswer['build']> {
  const response = await postBuild(
    server,
    'reef',
    secret,
    [{ path: 'chars/kelp-diver.glb', bytes: await diverGlb({ defect: 'zero-key' }) }],
    {
      branch: 'feature/swim',
      label
    }
  );
  expect(response.status, await response.clone().text()).toBe(201);
  return ((await response.json()) as BuildAnswer).build;
}

async function findingsOf(buildId: number): Promise<FindingAnswer['findings']> {
  const response = await api('viewer', 'GET', `builds/${buildId}/findings?pageSize=100`);
  expect(response.status).toBe(200);
  return ((await response.json()) as FindingAnswer).findings;
}

async function proposeAndApprove(body: Record<string, unknown>): Promise<number> {
  const proposed = await api('artist', 'POST', 'waivers', { reason: 'Held key on purpose.', ...body });
  expect(proposed.status, await proposed.clone().text()).toBe(201);
  const id = ((await proposed.json()) as { waiver: { id: number } }).waiver.id;
  expect((await api('lead', 'POST', `waivers/${id}/decision`, { action: 'approve' })).status).toBe(200);
  return id;
}

beforeAll(async () => {
  server = await startApiTestServer();
  const lead = await seedUser('nell.lead@lanternfish.example', 'lead');
  const artist = await seedUser('ari.artist@lanternfish.example', 'artist');
  const viewer = await seedUser('vic.viewer@lanternfish.example', 'viewer');
  ({ secret } = await seedProject('reef', [
    { user: lead, role: 'lead' },
    { user: artist, role: 'artist' },
    { user: viewer, role: 'viewer' }
  ]));
  [cookie.lead, cookie.artist, cookie.viewer] = await Promise.all(
    [lead, artist, viewer].map((user) => signIn(server, user))
  );
  const clean = await postBuild(server, 'reef', secret, [{ path: 'chars/kelp-diver.glb', bytes: await diverGlb() }], {
    branch: 'main',
    label: 'clean base'
  });
  expect(clean.status).toBe(201);
});
afterAll(async () => server?.remove());

describe('before any waiver', () => {
  it('fails the feature build on its new error', async () => {
    const build = await postDefectiveBuild('#1');
    expect(build.verdict).toBe('fail');
    const findings = await findingsOf(build.id);
    blockingFinding = findings.find((finding) => finding.severity === 'error')!;
    expect(blockingFinding).toMatchObject({ rule: 'not-a-rotation', asset: 'chars/kelp-diver.glb', waived: false });
  });
});

describe('who may propose and decide over the API', () => {
  it('refuses a proposal from a viewer (403) and an empty reason (400)', async () => {
    const fromViewer = await api('viewer', 'POST', 'waivers', {
      scope: 'fingerprint',
      fingerprint: blockingFinding.fingerprint,
      reason: 'Looks fine to me.'
    });
    expect(fromViewer.status).toBe(403);
    const noReason = await api('artist', 'POST', 'waivers', {
      scope: 'fingerprint',
      fingerprint: blockingFinding.fingerprint,
      reason: ' '
    });
    expect(noReason.status).toBe(400);
    expect(((await noReason.json()) as { error: { message: string } }).error.message).toMatch(/^reason:/);
  });

  it('refuses a decision from the artist who proposed, and a second decision on a decided waiver (409)', async () => {
    const proposed = await api('artist', 'POST', 'waivers', {
      scope: 'fingerprint',
      fingerprint: 'aaaaaaaaaaaaaaaa',
      reason: 'A stand-in waiver for the rights check.'
    });
    const { waiver } = (await proposed.json()) as { waiver: { id: number; state: string } };
    expect(waiver.state).toBe('proposed');
    expect((await api('artist', 'POST', `waivers/${waiver.id}/decision`, { action: 'approve' })).status).toBe(403);
    expect((await api('lead', 'POST', `waivers/${waiver.id}/decision`, { action: 'reject', note: 'No.' })).status).toBe(
      200
    );
    const again = await api('lead', 'POST', `waivers/${waiver.id}/decision`, { action: 'approve' });
    expect(again.status).toBe(409);
    expect(((await again.json()) as { error: { code: string } }).error.code).toBe('waiver.state');
  });

  it('does not apply a proposal nobody approved yet', async () => {
    const proposed = await api('artist', 'POST', 'waivers', {
      scope: 'fingerprint',
      fingerprint: blockingFinding.fingerprint,
      reason: 'Waiting for the lead.'
    });
    expect(proposed.status).toBe(201);
    expect((await postDefectiveBuild('#2')).verdict).toBe('fail');
    const { waiver } = (await proposed.json()) as { waiver: { id: number } };
    expect((await api('lead', 'POST', `waivers/${waiver.id}/decision`, { action: 'reject' })).status).toBe(200);
  });
});

describe('the gate applies approved waivers from the next build on', () => {
  it('passes the next build once a lead approved a fingerprint waiver, marking the finding waived', async () => {
    const waiverId = await proposeAndApprove({ scope: 'fingerprint', fingerprint: blockingFinding.fingerprint });
    const build = await postDefectiveBuild('#3');
    expect(build.verdict).toBe('pass');
    expect(build.counts.waived).toBe(1);
    const waived = (await findingsOf(build.id)).find((finding) => finding.fingerprint === blockingFinding.fingerprint);
    expect(waived).toMatchObject({ waived: true, waiverId });

    // Revoked, it stops applying: the build after fails again.
    expect((await api('lead', 'POST', `waivers/${waiverId}/decision`, { action: 'revoke' })).status).toBe(200);
    expect((await postDefectiveBuild('#4')).verdict).toBe('fail');
  });

  it('passes the next build under a rule-and-asset waiver written with ./ and backslashes', async () => {
    const waiverId = await proposeAndApprove({
      scope: 'rule-asset',
      rule: blockingFinding.rule,
      assetPath: '.\\chars\\kelp-diver.glb'
    });
    expect((await postDefectiveBuild('#5')).verdict).toBe('pass');

    // Once its expiry has passed (moved back in the database here), the gate no longer applies it.
    await Waiver.update({ expiresAt: new Date(Date.now() - 60_000) }, { where: { id: waiverId } });
    expect((await postDefectiveBuild('#6')).verdict).toBe('fail');
    const listed = (await (await api('viewer', 'GET', `waivers/${waiverId}`)).json()) as { waiver: { state: string } };
    expect(listed.waiver.state).toBe('expired');
  });
});

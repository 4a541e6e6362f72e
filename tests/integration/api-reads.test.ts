/**
 * The read side of the API through the real server, signed in through Auth.js like a browser:
 * build lists, build detail, findings, channel plots, trends, report downloads and tokens.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ApiToken, FindingRecord, Waiver } from '$lib/server/db/models';
import { aboutY, diverGlb, diverGltf, longClipGlb } from './api-fixtures';
import {
  postBuild,
  seedProject,
  seedUser,
  signIn,
  startApiTestServer,
  type ApiTestServer,
  type SeededUser,
  type UploadFile
} from './api-test-server';

let server: ApiTestServer;
let secret: string;
let harbourSecret: string;
let lead: SeededUser;
let viewer: SeededUser;
let leadCookie: string;
let viewerCookie: string;
let outsiderCookie: string;
let adminCookie: string;
const buildIds: number[] = [];

async function files(defect: 'none' | 'zero-key' | 'backwards-time'): Promise<UploadFile[]> {
  const buoy = await diverGltf({ jointName: 'Float', binName: 'buoy.bin' });
  return [
    { path: 'chars/kelp-diver.glb', bytes: await diverGlb({ defect }) },
    { path: 'props/buoy.gltf', bytes: buoy.gltf },
    { path: 'props/buoy.bin', bytes: buoy.bin }
  ];
}

beforeAll(async () => {
  server = await startApiTestServer();
  lead = await seedUser('mira.lead@lanternfish.example', 'lead');
  viewer = await seedUser('oskar.viewer@lanternfish.example', 'viewer');
  const outsider = await seedUser('pim.outsider@lanternfish.example', 'artist');
  const admin = await seedUser('ada.admin@lanternfish.example', 'admin');
  ({ secret } = await seedProject('tidewatch', [
    { user: lead, role: 'lead' },
    { user: viewer, role: 'viewer' }
  ]));
  ({ secret: harbourSecret } = await seedProject('harbour-props', [{ user: outsider, role: 'lead' }]));
  [leadCookie, viewerCookie, outsiderCookie, adminCookie] = await Promise.all(
    [lead, viewer, outsider, admin].map((user) => signIn(server, user))
  );
  // main: clean, regression, fixed; one feature branch build in between.
  for (const [defect, branch, label] of [
    ['none', 'main', '#1'],
    ['zero-key', 'feature/swim', '#2'],
    ['backwards-time', 'main', '#3'],
    ['none', 'main', '#4']
  ] as const) {
    const response = await postBuild(server, 'tidewatch', secret, await files(defect), { branch, label });
    expect(response.status).toBe(201);
    buildIds.push(((await response.json()) as { build: { id: number } }).build.id);
  }
});
afterAll(async () => server?.remove());

async function get(path: string, cookie: string | null): Promise<Response> {
  return fetch(`${server.url}/api/v1/projects/${path}`, { headers: cookie ? { cookie } : {} });
}

async function getJson<T>(path: string, cookie: string | null = viewerCookie): Promise<T> {
  const response = await get(path, cookie);
  expect(response.status, await response.clone().text()).toBe(200);
  return (await response.json()) as T;
}

async function expectError(response: Response, status: number, code: string): Promise<void> {
  expect(response.status).toBe(status);
  expect(((await response.json()) as { error: { code: string } }).error.code).toBe(code);
}

describe('who may read', () => {
  it('answers 401 without a session', async () => {
    await expectError(await get('tidewatch/builds', null), 401, 'auth.required');
  });

  it('answers 404 to a signed-in user who is not a member, as for an unknown project', async () => {
    await expectError(await get('tidewatch/builds', outsiderCookie), 404, 'project.not-found');
    await expectError(await get('no-such-project/builds', viewerCookie), 404, 'project.not-found');
  });

  it('lets an admin read any project', async () => {
    const page = await getJson<{ total: number }>('tidewatch/builds', adminCookie);
    expect(page.total).toBe(4);
  });

  it('answers 404 for a build of another project or a non-numeric id', async () => {
    await expectError(await get('tidewatch/builds/999999', viewerCookie), 404, 'build.not-found');
    await expectError(await get('tidewatch/builds/abc', viewerCookie), 404, 'build.not-found');
  });
});

describe('GET builds', () => {
  type Page = {
    builds: { id: number; branch: string; verdict: string; label: string }[];
    total: number;
    totalPages: number;
  };

  it('lists newest first with paging', async () => {
    const page = await getJson<Page>('tidewatch/builds?pageSize=3');
    expect(page.builds.map((build) => build.label)).toEqual(['#4', '#3', '#2']);
    expect([page.total, page.totalPages]).toEqual([4, 2]);
    const second = await getJson<Page>('tidewatch/builds?pageSize=3&page=2');
    expect(second.builds.map((build) => build.label)).toEqual(['#1']);
  });

  it('filters by branch and verdict and sorts oldest first', async () => {
    const main = await getJson<Page>('tidewatch/builds?branch=main&sort=oldest');
    expect(main.builds.map((build) => build.label)).toEqual(['#1', '#3', '#4']);
    const failed = await getJson<Page>('tidewatch/builds?verdict=fail');
    expect(failed.builds.map((build) => build.label)).toEqual(['#3', '#2']);
  });

  it('answers 400 naming a bad query parameter', async () => {
    const response = await get('tidewatch/builds?pageSize=500', viewerCookie);
    expect(response.status).toBe(400);
    const body = (await response.json()) as { error: { code: string; message: string } };
    expect(body.error.code).toBe('query.invalid');
    expect(body.error.message).toMatch(/^pageSize: .*got "500"/);
  });
});

describe('GET builds/{id}', () => {
  it('gives the build with its assets, counts and baseline', async () => {
    const detail = await getJson<{
      build: { id: number; verdict: string; counts: Record<string, number> };
      baseline: { id: number } | null;
      assets: {
        path: string;
        counts: Record<string, number>;
        worstRule: string | null;
        stats: { rotationKeys: number };
      }[];
    }>(`tidewatch/builds/${buildIds[2]}`);
    expect(detail.build).toMatchObject({ id: buildIds[2], verdict: 'fail' });
    expect(detail.baseline?.id).toBe(buildIds[0]);
    expect(detail.assets.map((asset) => [asset.path, asset.counts.error, asset.worstRule])).toEqual([
      ['chars/kelp-diver.glb', 1, 'key-times'],
      ['props/buoy.gltf', 0, null]
    ]);
    // Four keys per clip in the fixture.
    expect(detail.assets[1].stats.rotationKeys).toBe(4);
  });
});

describe('GET builds/{id}/findings', () => {
  type Findings = { findings: { rule: string; standing: string; asset: string; time: number | null }[]; total: number };

  it('lists the findings of a build with their standing', async () => {
    const regression = await getJson<Findings>(`tidewatch/builds/${buildIds[2]}/findings`);
    expect(regression.findings.map((f) => [f.rule, f.standing, f.asset])).toEqual([
      ['key-times', 'new', 'chars/kelp-diver.glb']
    ]);
    const fixed = await getJson<Findings>(`tidewatch/builds/${buildIds[3]}/findings?status=fixed`);
    expect(fixed.findings.map((f) => [f.rule, f.standing])).toEqual([['key-times', 'fixed']]);
  });

  it.each([
    { query: 'rule=key-times', total: 1 },
    { query: 'rule=wide-arc', total: 0 },
    { query: 'severity=error', total: 1 },
    { query: 'severity=info', total: 0 },
    { query: 'asset=chars/kelp-diver.glb', total: 1 },
    { query: 'asset=props/buoy.gltf', total: 0 },
    { query: 'status=new', total: 1 },
    { query: 'status=unchanged', total: 0 },
    { query: 'status=waived', total: 0 }
  ])('filters with $query', async ({ query, total }) => {
    expect((await getJson<Findings>(`tidewatch/builds/${buildIds[2]}/findings?${query}`)).total).toBe(total);
  });

  it('answers 400 for an unknown status', async () => {
    await expectError(
      await get(`tidewatch/builds/${buildIds[2]}/findings?status=open`, viewerCookie),
      400,
      'query.invalid'
    );
  });
});

describe('GET builds/{id}/assets/{assetId}/channels', () => {
  type Channels = {
    asset: { path: string };
    channels: {
      animation: string;
      nodePath: string;
      interpolation: string;
      times: number[];
      x: number[];
      y: number[];
      z: number[];
      w: number[];
      length: number[];
      angularSpeed: (number | null)[];
      markers: { keyIndex: number | null; rule: string; severity: string }[];
    }[];
  };

  async function assetIds(buildId: number): Promise<Record<string, number>> {
    const detail = await getJson<{ assets: { id: number; path: string }[] }>(`tidewatch/builds/${buildId}`);
    return Object.fromEntries(detail.assets.map((asset) => [asset.path, asset.id]));
  }

  it('gives a .gltf channel read back from its blobs, with per-key series and per-segment speeds', async () => {
    const ids = await assetIds(buildIds[0]);
    const { asset, channels } = await getJson<Channels>(
      `tidewatch/builds/${buildIds[0]}/assets/${ids['props/buoy.gltf']}/channels`
    );
    expect(asset.path).toBe('props/buoy.gltf');
    expect(channels).toHaveLength(1);
    const [channel] = channels;
    expect(channel).toMatchObject({
      animation: 'Swim',
      nodePath: '/Diver/Float',
      interpolation: 'LINEAR',
      markers: []
    });
    expect(channel.times).toEqual([0, 0.5, 1, 1.5]);
    const expected = [0, 20, 50, 60].map(aboutY);
    const tolerance = 1e-6; // float32 storage of the fixture's keys
    channel.y.forEach((y, key) => expect(Math.abs(y - expected[key][1])).toBeLessThan(tolerance));
    channel.w.forEach((w, key) => expect(Math.abs(w - expected[key][3])).toBeLessThan(tolerance));
    channel.length.forEach((length) => expect(Math.abs(length - 1)).toBeLessThan(tolerance));
    // Turns of 20°, 30° and 10° over 0.5 s each: 40, 60 and 20 °/s (angle between unit quaternions
    // is 2·acos|q1·q2|, Shoemake 1985).
    [40, 60, 20].forEach((speed, segment) =>
      expect(Math.abs(channel.angularSpeed[segment]! - speed)).toBeLessThan(1e-3)
    );
  });

  it('puts the finding markers on the channel they point into', async () => {
    const ids = await assetIds(buildIds[1]);
    const { channels } = await getJson<Channels>(
      `tidewatch/builds/${buildIds[1]}/assets/${ids['chars/kelp-diver.glb']}/channels`
    );
    expect(channels[0].markers).toEqual([
      expect.objectContaining({ keyIndex: 2, rule: 'not-a-rotation', severity: 'error' })
    ]);
    // A zero key has no direction: the segments touching it have no speed.
    expect(channels[0].angularSpeed[1]).toBeNull();
    expect(channels[0].angularSpeed[2]).toBeNull();
  });

  it('answers only the channel named by ?channel=<animation>:<channel>', async () => {
    const ids = await assetIds(buildIds[0]);
    const path = `tidewatch/builds/${buildIds[0]}/assets/${ids['props/buoy.gltf']}/channels`;
    const { channels } = await getJson<Channels>(`${path}?channel=0:0`);
    expect(channels.map((channel) => channel.nodePath)).toEqual(['/Diver/Float']);
    await expectError(await get(`${path}?channel=0:7`, viewerCookie), 404, 'channel.not-found');
    await expectError(await get(`${path}?channel=first`, viewerCookie), 400, 'query.invalid');
  });

  describe('an asset with more keys than one answer plots', () => {
    let path: string;
    beforeAll(async () => {
      // 210,000 keys on channel 0 and 1,000 on channel 1, past the 200,000-key cap together.
      const response = await postBuild(
        server,
        'harbour-props',
        harbourSecret,
        [{ path: 'props/tide-kelp.glb', bytes: await longClipGlb([210_000, 1_000]) }],
        { branch: 'main' }
      );
      expect(response.status).toBe(201);
      const buildId = ((await response.json()) as { build: { id: number } }).build.id;
      const detail = await getJson<{ assets: { id: number }[] }>(`harbour-props/builds/${buildId}`, outsiderCookie);
      path = `harbour-props/builds/${buildId}/assets/${detail.assets[0].id}/channels`;
    });

    it('refuses the whole asset with 422 channels.too-many-keys saying to ask per channel', async () => {
      const response = await get(path, outsiderCookie);
      expect(response.status).toBe(422);
      const { error } = (await response.json()) as { error: { code: string; message: string } };
      expect(error.code).toBe('channels.too-many-keys');
      expect(error.message).toContain('211,000 rotation keys in 2 channels');
      expect(error.message).toContain('?channel=<animationIndex>:<channelIndex>');
    });

    it('answers a short channel of it on its own', async () => {
      const { channels } = await getJson<Channels>(`${path}?channel=0:1`, outsiderCookie);
      expect(channels).toHaveLength(1);
      expect(channels[0].times).toHaveLength(1_000);
    });

    it('refuses a channel that alone is past the cap, naming it and its key count', async () => {
      const response = await get(`${path}?channel=0:0`, outsiderCookie);
      expect(response.status).toBe(422);
      const { error } = (await response.json()) as { error: { code: string; message: string } };
      expect(error.code).toBe('channels.too-many-keys');
      expect(error.message).toContain('Channel 0:0 of props/tide-kelp.glb has 210,000 keys');
    });
  });

  it('answers 404 for an asset of another build', async () => {
    const ids = await assetIds(buildIds[0]);
    await expectError(
      await get(`tidewatch/builds/${buildIds[1]}/assets/${ids['props/buoy.gltf']}/channels`, viewerCookie),
      404,
      'asset.not-found'
    );
  });
});

describe('GET trends', () => {
  it('gives the base branch builds oldest first with counts by severity and rule', async () => {
    const trend = await getJson<{
      branch: string;
      builds: { buildId: number; assets: number; counts: Record<string, number>; byRule: Record<string, number> }[];
    }>('tidewatch/trends');
    expect(trend.branch).toBe('main');
    expect(trend.builds.map((point) => [point.buildId, point.assets, point.counts.error, point.byRule])).toEqual([
      [buildIds[0], 2, 0, {}],
      [buildIds[2], 2, 1, { 'key-times': 1 }],
      [buildIds[3], 2, 0, {}]
    ]);
  });

  it('follows another branch and a time range', async () => {
    const feature = await getJson<{ builds: { buildId: number }[] }>('tidewatch/trends?branch=feature/swim');
    expect(feature.builds.map((point) => point.buildId)).toEqual([buildIds[1]]);
    const none = await getJson<{ builds: unknown[] }>('tidewatch/trends?to=2001-01-01');
    expect(none.builds).toEqual([]);
    const today = new Date().toISOString().slice(0, 10);
    const all = await getJson<{ builds: unknown[] }>(`tidewatch/trends?from=${today}&to=${today}`);
    expect(all.builds).toHaveLength(3);
  });

  it('answers 400 for a date that is no date', async () => {
    await expectError(await get('tidewatch/trends?from=yesterday', viewerCookie), 400, 'query.invalid');
  });
});

describe('GET builds/{id}/report.{format}', () => {
  it.each([
    { format: 'json', type: 'application/json', file: 'json' },
    { format: 'sarif', type: 'application/sarif+json', file: 'sarif' },
    { format: 'junit', type: 'application/xml', file: 'xml' }
  ])('downloads the $format report as an attachment', async ({ format, type, file }) => {
    const response = await get(`tidewatch/builds/${buildIds[2]}/report.${format}`, viewerCookie);
    expect(response.status).toBe(200);
    expect(response.headers.get('content-type')).toContain(type);
    expect(response.headers.get('content-disposition')).toBe(
      `attachment; filename="orientry-tidewatch-build-${buildIds[2]}.${file}"`
    );
    const text = await response.text();
    expect(text).toContain('key-times');
    expect(text).toContain('chars/kelp-diver.glb');
  });

  it('rebuilds the JSON report from the stored rows', async () => {
    const report = await getJson<{
      schema: string;
      assets: { path: string; findings: { rule: string }[] }[];
      summary: { error: number; assets: number; findings: number };
    }>(`tidewatch/builds/${buildIds[2]}/report.json`);
    expect(report.schema).toBe('orientry.lint-report');
    expect(report.summary).toMatchObject({ error: 1, assets: 2, findings: 1 });
    expect(report.assets.map((asset) => [asset.path, asset.findings.map((f) => f.rule)])).toEqual([
      ['chars/kelp-diver.glb', ['key-times']],
      ['props/buoy.gltf', []]
    ]);
  });

  it('answers 404 for an unknown format', async () => {
    await expectError(
      await get(`tidewatch/builds/${buildIds[2]}/report.pdf`, viewerCookie),
      404,
      'report.format-unknown'
    );
  });
});

describe('tokens', () => {
  async function send(method: string, path: string, cookie: string, body?: unknown): Promise<Response> {
    return fetch(`${server.url}/api/v1/projects/${path}`, {
      method,
      headers: { cookie, 'content-type': 'application/json', origin: server.url },
      body: body === undefined ? undefined : JSON.stringify(body)
    });
  }

  it('lets a lead create a token whose secret is shown once and works for submitting', async () => {
    const response = await send('POST', 'tidewatch/tokens', leadCookie, { name: 'CI nightly' });
    expect(response.status).toBe(201);
    const { token } = (await response.json()) as {
      token: { id: number; secret: string; prefix: string; name: string };
    };
    expect(token.secret).toMatch(/^ort_[A-Za-z0-9_-]{43}$/);
    expect(token.prefix).toBe(token.secret.slice(0, 12));
    const stored = await ApiToken.findByPk(token.id);
    expect(stored?.tokenHash).toMatch(/^[0-9a-f]{64}$/);
    expect(stored?.tokenHash).not.toContain(token.secret);

    const submitted = await postBuild(server, 'tidewatch', token.secret, await files('none'), {
      branch: 'feature/token'
    });
    expect(submitted.status).toBe(201);
    expect((await ApiToken.findByPk(token.id))?.lastUsedAt).not.toBeNull();

    const list = await getJson<{ tokens: { id: number; secret?: string }[] }>('tidewatch/tokens', leadCookie);
    const listed = list.tokens.find((t) => t.id === token.id);
    expect(listed).toBeDefined();
    expect(listed).not.toHaveProperty('secret');
  });

  it('refuses a viewer (403) and a bad name (400)', async () => {
    await expectError(
      await send('POST', 'tidewatch/tokens', viewerCookie, { name: 'x' }),
      403,
      'project.role-required'
    );
    await expectError(await send('POST', 'tidewatch/tokens', leadCookie, { name: '' }), 400, 'body.invalid');
  });

  it('revokes a token, after which submitting with it answers 403', async () => {
    const created = await send('POST', 'tidewatch/tokens', leadCookie, { name: 'short-lived' });
    const { token } = (await created.json()) as { token: { id: number; secret: string } };
    const revoked = await send('DELETE', `tidewatch/tokens/${token.id}`, leadCookie);
    expect(revoked.status).toBe(200);
    expect(((await revoked.json()) as { token: { revokedAt: string | null } }).token.revokedAt).not.toBeNull();
    const refused = await postBuild(server, 'tidewatch', token.secret, await files('none'), { branch: 'main' });
    await expectError(refused, 403, 'auth.token-revoked');
    await expectError(await send('DELETE', 'tidewatch/tokens/999999', leadCookie), 404, 'token.not-found');
  });
});

describe('GET builds/{id}/report.{format} with the project API token', () => {
  let harbourBuildId: number;
  let waivedBuildId: number;
  let waiverId: number;

  const bearer = (token: string) => ({ authorization: `Bearer ${token}` });
  const getReport = (path: string, headers: Record<string, string>) =>
    fetch(`${server.url}/api/v1/projects/${path}`, { headers });

  beforeAll(async () => {
    const harbour = await postBuild(server, 'harbour-props', harbourSecret, await files('none'), { branch: 'main' });
    harbourBuildId = ((await harbour.json()) as { build: { id: number } }).build.id;
    // A lead waives the zero key of the feature build; the next build with it stores the waiver.
    const [finding] = await FindingRecord.findAll({ where: { buildId: buildIds[1] } });
    const waiver = await Waiver.create({
      projectId: await projectIdOf('tidewatch'),
      scope: 'fingerprint',
      fingerprint: finding.fingerprint,
      rule: null,
      assetPath: null,
      reason: 'The swim cycle is re-exported next sprint.',
      expiresAt: new Date('2099-01-01T00:00:00Z'),
      status: 'approved',
      proposedById: null
    });
    waiverId = waiver.id;
    const waived = await postBuild(server, 'tidewatch', secret, await files('zero-key'), { branch: 'feature/waived' });
    waivedBuildId = ((await waived.json()) as { build: { id: number } }).build.id;
  });

  async function projectIdOf(slug: string): Promise<number> {
    const [rows] = await server.database.sequelize.query('SELECT id FROM projects WHERE slug = ?', {
      replacements: [slug]
    });
    return (rows as { id: number }[])[0].id;
  }

  it.each(['json', 'sarif', 'junit'])("gives the %s report to the token of the build's project", async (format) => {
    const response = await getReport(`tidewatch/builds/${buildIds[2]}/report.${format}`, bearer(secret));
    expect(response.status, await response.clone().text()).toBe(200);
    expect(await response.text()).toContain('key-times');
  });

  it("puts the build, its verdict and each result's baseline state into the SARIF run", async () => {
    const response = await getReport(`tidewatch/builds/${buildIds[2]}/report.sarif`, bearer(secret));
    const sarif = (await response.json()) as {
      runs: {
        results: { ruleId: string; baselineState: string; suppressions?: unknown[] }[];
        properties: { build: { id: number; verdict: string; baselineBuildId: number; reportUrl: string } };
      }[];
    };
    const [run] = sarif.runs;
    expect(run.properties.build).toMatchObject({
      id: buildIds[2],
      verdict: 'fail',
      baselineBuildId: buildIds[0],
      reportUrl: `${server.url}/projects/tidewatch/builds/${buildIds[2]}`
    });
    // SARIF 2.1.0 result.baselineState: "new" for a result absent from the baseline run.
    expect(run.results.map((result) => [result.ruleId, result.baselineState, result.suppressions])).toEqual([
      ['key-times', 'new', undefined]
    ]);
  });

  it("adds the build and each finding's baseline status and waiver to the JSON report", async () => {
    // The latest main build (#4) is clean, so the zero key is new; the waiver covers it.
    const response = await getReport(`tidewatch/builds/${waivedBuildId}/report.json`, bearer(secret));
    const report = (await response.json()) as {
      build: { id: number; verdict: string; counts: { waived: number } };
      assets: { findings: { rule: string; baselineStatus: string; waiver: { id: number; reason: string } | null }[] }[];
    };
    expect(report.build).toMatchObject({ id: waivedBuildId, verdict: 'pass', counts: { waived: 1 } });
    const findings = report.assets.flatMap((asset) => asset.findings);
    expect(findings.map((finding) => [finding.rule, finding.baselineStatus, finding.waiver?.id])).toEqual([
      ['not-a-rotation', 'new', waiverId]
    ]);
    expect(findings[0].waiver?.reason).toBe('The swim cycle is re-exported next sprint.');
  });

  it('turns a waived finding into an accepted external suppression in SARIF', async () => {
    const response = await getReport(`tidewatch/builds/${waivedBuildId}/report.sarif`, bearer(secret));
    const sarif = (await response.json()) as {
      runs: { results: { suppressions?: { kind: string; status: string; justification: string }[] }[] }[];
    };
    // SARIF 2.1.0 suppression object: kind "external" (kept outside the files), status "accepted".
    expect(sarif.runs[0].results[0].suppressions).toEqual([
      expect.objectContaining({
        kind: 'external',
        status: 'accepted',
        justification: 'The swim cycle is re-exported next sprint.'
      })
    ]);
  });

  it("answers 404 for another project's build asked for under this project", async () => {
    await expectError(
      await getReport(`tidewatch/builds/${harbourBuildId}/report.json`, bearer(secret)),
      404,
      'build.not-found'
    );
  });

  it("answers 403 to a token used on another project's reports", async () => {
    await expectError(
      await getReport(`harbour-props/builds/${harbourBuildId}/report.json`, bearer(secret)),
      403,
      'auth.token-wrong-project'
    );
  });

  it('answers 401 to an unknown token, also when a session cookie comes with it', async () => {
    await expectError(
      await getReport(`tidewatch/builds/${buildIds[2]}/report.json`, {
        ...bearer(`${secret.slice(0, -4)}zzzz`),
        cookie: viewerCookie
      }),
      401,
      'auth.token-invalid'
    );
  });

  it('answers 404 for an unknown project on the token path', async () => {
    await expectError(await getReport('no-such-game/builds/1/report.json', bearer(secret)), 404, 'project.not-found');
  });

  it('opens only the report: the build list still needs a signed-in member', async () => {
    await expectError(await getReport('tidewatch/builds', bearer(secret)), 401, 'auth.required');
  });
});

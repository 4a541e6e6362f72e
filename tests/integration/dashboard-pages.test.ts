/**
 * The technical artists' pages through the real server, signed in like a browser: the builds table
 * (filters, sort, roles), the build report (verdict, finding filters, waiver links by role), the asset
 * view (node tree, channel chosen from a finding) and the fixed-asset download, whose GLB is linted
 * again with the lint library to show the fix took.
 */
import { Document, WebIO } from '@gltf-transform/core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { lintAsset } from '$lib/lint/lint-asset';
import { defaultPolicy } from '$lib/lint/policy';
import { aboutY, diverGlb } from './api-fixtures';
import {
  postBuild,
  seedProject,
  seedUser,
  signIn,
  startApiTestServer,
  type ApiTestServer,
  type SeededUser
} from './api-test-server';

let server: ApiTestServer;
let lead: SeededUser;
let artist: SeededUser;
let viewer: SeededUser;
const cookies: Record<'lead' | 'artist' | 'viewer' | 'outsider', string> = {
  lead: '',
  artist: '',
  viewer: '',
  outsider: ''
};
const builds: Record<'clean' | 'failing' | 'flipOnMain', number> = { clean: 0, failing: 0, flipOnMain: 0 };

/**
 * A lamp whose shade turns 0°, 30°, 60°, 90°, 120° about +Y on a LINEAR sampler; with `isFlipped`,
 * key 2 is stored negated (-q is the same rotation, glTF 2.0 Appendix C), a hemisphere jump.
 */
async function lampGlb(isFlipped: boolean): Promise<Uint8Array> {
  const document = new Document();
  const buffer = document.createBuffer();
  const shade = document.createNode('Shade');
  document.createScene('Harbour').addChild(document.createNode('Lamp').addChild(shade));
  const keys = [0, 30, 60, 90, 120].map((angle) => aboutY(angle));
  if (isFlipped) keys[2] = keys[2].map((component) => -component) as (typeof keys)[number];
  const input = document
    .createAccessor()
    .setType('SCALAR')
    .setArray(new Float32Array([0, 0.25, 0.5, 0.75, 1]));
  const output = document.createAccessor().setType('VEC4').setArray(new Float32Array(keys.flat()));
  input.setBuffer(buffer);
  output.setBuffer(buffer);
  const sampler = document.createAnimationSampler().setInput(input).setOutput(output).setInterpolation('LINEAR');
  document
    .createAnimation('Spin')
    .addSampler(sampler)
    .addChannel(document.createAnimationChannel().setTargetNode(shade).setTargetPath('rotation').setSampler(sampler));
  return new WebIO().writeBinary(document);
}

async function get(path: string, cookie: string): Promise<Response> {
  return fetch(`${server.url}${path}`, { headers: { cookie }, redirect: 'manual' });
}

async function page(path: string, cookie: string): Promise<string> {
  const response = await get(path, cookie);
  expect(response.status, `${path} answers 200`).toBe(200);
  return response.text();
}

/** Build labels in the order the builds table shows them. */
function labelsIn(html: string): string[] {
  return [...html.matchAll(/class="link-quiet font-medium"[^>]*>(#[^<]+)</g)].map((match) => match[1]);
}

beforeAll(async () => {
  server = await startApiTestServer();
  lead = await seedUser('mira.lead@lanternfish.example', 'lead');
  artist = await seedUser('juno.artist@lanternfish.example', 'artist');
  viewer = await seedUser('oskar.viewer@lanternfish.example', 'viewer');
  const outsider = await seedUser('pim.outsider@lanternfish.example', 'artist');
  const { secret } = await seedProject('tidewatch-props', [
    { user: lead, role: 'lead' },
    { user: artist, role: 'artist' },
    { user: viewer, role: 'viewer' }
  ]);
  await seedProject('harbour-cams', [{ user: outsider, role: 'lead' }]);
  [cookies.lead, cookies.artist, cookies.viewer, cookies.outsider] = await Promise.all(
    [lead, artist, viewer, outsider].map((user) => signIn(server, user))
  );
  const plan = [
    ['clean', 'main', '#201', false, 'none'],
    ['failing', 'feature/lamp-rework', '#202', true, 'zero-key'],
    ['flipOnMain', 'main', '#203', true, 'none']
  ] as const;
  for (const [name, branch, label, isFlipped, diverDefect] of plan) {
    const response = await postBuild(
      server,
      'tidewatch-props',
      secret,
      [
        { path: 'props/lamp.glb', bytes: await lampGlb(isFlipped) },
        { path: 'chars/kelp-diver.glb', bytes: await diverGlb({ defect: diverDefect }) }
      ],
      {
        branch,
        label,
        commit: `${label.slice(1)}0c0ffee`,
        ciJobUrl: `https://ci.lanternfish.example/jobs/${label.slice(1)}`
      }
    );
    expect(response.status).toBe(201);
    builds[name] = ((await response.json()) as { build: { id: number } }).build.id;
  }
}, 600_000);

afterAll(async () => {
  await server?.remove();
});

describe('builds page', () => {
  it('lists every build of the project, newest first, for a viewer', async () => {
    const html = await page('/projects/tidewatch-props', cookies.viewer);
    expect(labelsIn(html)).toEqual(['#203', '#202', '#201']);
    expect(html).toContain('feature/lamp-rework');
    expect(html).toMatch(
      /<a href="https:\/\/ci\.lanternfish\.example\/jobs\/203"[^>]* target="_blank" rel="noopener noreferrer"/
    );
  });

  it('filters by verdict and branch from the URL query', async () => {
    expect(labelsIn(await page('/projects/tidewatch-props?verdict=fail', cookies.viewer))).toEqual(['#202']);
    expect(labelsIn(await page('/projects/tidewatch-props?branch=main', cookies.viewer))).toEqual(['#203', '#201']);
    const none = await page('/projects/tidewatch-props?branch=main&verdict=fail', cookies.viewer);
    expect(labelsIn(none)).toEqual([]);
    expect(none).toContain('No builds match these filters');
  });

  it('sorts by verdict (failed first) and by new findings, and falls back to newest for an unknown sort', async () => {
    expect(labelsIn(await page('/projects/tidewatch-props?sort=verdict&order=desc', cookies.viewer))[0]).toBe('#202');
    const listed = (await (await get('/api/v1/projects/tidewatch-props/builds', cookies.viewer)).json()) as {
      builds: { label: string; counts: { new: number } }[];
    };
    // The API lists newest first; a stable sort by new findings keeps newest first among ties, as the table does.
    const mostNewFirst = [...listed.builds].sort((a, b) => b.counts.new - a.counts.new).map((build) => build.label);
    expect(new Set(listed.builds.map((build) => build.counts.new)).size).toBeGreaterThan(1);
    expect(labelsIn(await page('/projects/tidewatch-props?sort=new&order=desc', cookies.viewer))).toEqual(mostNewFirst);
    expect(labelsIn(await page('/projects/tidewatch-props?sort=sideways', cookies.viewer))).toEqual([
      '#203',
      '#202',
      '#201'
    ]);
  });

  it('hides the project from non-members and sends anonymous visitors to sign in', async () => {
    expect((await get('/projects/tidewatch-props', cookies.outsider)).status).toBe(404);
    const anonymous = await get('/projects/tidewatch-props', '');
    expect(anonymous.status).toBe(303);
    expect(anonymous.headers.get('location')).toMatch(/^\/signin\?redirectTo=/);
  });

  it('shows the Settings tab to leads only', async () => {
    expect(await page('/projects/tidewatch-props', cookies.lead)).toMatch(/>Settings<\/a>/);
    expect(await page('/projects/tidewatch-props', cookies.artist)).not.toMatch(/>Settings<\/a>/);
  });
});

describe('build report', () => {
  it('shows the verdict with its reason, the baseline and the export links', async () => {
    const html = await page(`/projects/tidewatch-props/builds/${builds.failing}`, cookies.viewer);
    expect(html).toContain('data-verdict="fail"');
    expect(html).toContain('not-a-rotation');
    expect(html).toContain(`/projects/tidewatch-props/builds/${builds.clean}"`);
    for (const format of ['json', 'sarif', 'junit']) {
      expect(html).toContain(`/api/v1/projects/tidewatch-props/builds/${builds.failing}/report.${format}`);
    }
  });

  it('lists findings worst first and applies the standing filter from the URL', async () => {
    const all = await page(`/projects/tidewatch-props/builds/${builds.failing}`, cookies.viewer);
    const severities = [...all.matchAll(/<tr data-finding-id="\d+"[\s\S]*?data-severity="(\w+)"/g)].map((m) => m[1]);
    expect(severities[0]).toBe('error');
    expect(severities).toContain('warning');
    const fixedOnly = await page(`/projects/tidewatch-props/builds/${builds.failing}?status=fixed`, cookies.viewer);
    expect(fixedOnly).not.toContain('data-finding-id=');
    expect(fixedOnly).toContain('No findings match these filters');
  });

  it('offers "Propose waiver" with the fingerprint to artists but not to viewers', async () => {
    const forArtist = await page(`/projects/tidewatch-props/builds/${builds.failing}`, cookies.artist);
    expect(forArtist).toMatch(/\/projects\/tidewatch-props\/waivers\?fingerprint=[0-9a-f]+&amp;rule=[\w-]+&amp;asset=/);
    const forViewer = await page(`/projects/tidewatch-props/builds/${builds.failing}`, cookies.viewer);
    expect(forViewer).not.toContain('Propose waiver');
  });

  it('answers 404 for a build of another project or no build at all', async () => {
    expect((await get('/projects/tidewatch-props/builds/999999', cookies.viewer)).status).toBe(404);
    expect((await get('/projects/tidewatch-props/builds/abc', cookies.viewer)).status).toBe(404);
  });

  it('lets a browser session download the SARIF export', async () => {
    const response = await get(
      `/api/v1/projects/tidewatch-props/builds/${builds.failing}/report.sarif`,
      cookies.viewer
    );
    expect(response.status).toBe(200);
    expect(response.headers.get('content-disposition')).toMatch(/attachment; filename=".+\.sarif"/);
    expect((await response.json()) as { version: string }).toMatchObject({ version: '2.1.0' });
  });
});

describe('asset view and fixed download', () => {
  async function lampAssetPath(buildId: number): Promise<string> {
    const response = await get(`/api/v1/projects/tidewatch-props/builds/${buildId}`, cookies.viewer);
    const detail = (await response.json()) as { assets: { id: number; path: string }[] };
    const lamp = detail.assets.find((asset) => asset.path === 'props/lamp.glb');
    if (!lamp) throw new Error('the build has no props/lamp.glb');
    return `/projects/tidewatch-props/builds/${buildId}/assets/${lamp.id}`;
  }

  it('shows the node tree and picks the channel of the finding named in the URL', async () => {
    const findings = (await (
      await get(
        `/api/v1/projects/tidewatch-props/builds/${builds.flipOnMain}/findings?rule=hemisphere-jump`,
        cookies.viewer
      )
    ).json()) as { findings: { id: number; keys: [number, number] }[] };
    const jump = findings.findings[0];
    // Key 2 was stored negated: the jump is between keys 1 and 2 or 2 and 3 (Appendix C: q and -q are one rotation).
    expect(jump.keys[0]).toBeGreaterThanOrEqual(1);
    const html = await page(`${await lampAssetPath(builds.flipOnMain)}?finding=${jump.id}`, cookies.viewer);
    expect(html).toContain('>Lamp</span>');
    expect(html).toContain('>Shade</span>');
    expect(html).toMatch(/aria-current="true"[^>]*>\s*<span[^>]*>Spin<\/span>/);
    expect(html).not.toContain('Download fixed asset');
  });

  it('gives artists the asset with its hemisphere jump fixed, as a GLB the lint library reads clean of that rule', async () => {
    const path = await lampAssetPath(builds.flipOnMain);
    expect(await page(path, cookies.artist)).toContain('Download fixed asset');
    const response = await get(`${path}/fixed`, cookies.artist);
    expect(response.status).toBe(200);
    expect(response.headers.get('content-type')).toBe('model/gltf-binary');
    expect(response.headers.get('content-disposition')).toBe('attachment; filename="lamp.fixed.glb"');
    const bytes = new Uint8Array(await response.arrayBuffer());
    // glTF 2.0 §4.4.2: a GLB starts with the magic "glTF".
    expect(new TextDecoder().decode(bytes.subarray(0, 4))).toBe('glTF');
    const policy = defaultPolicy();
    const before = await lintAsset(
      { path: 'props/lamp.glb', bytes: await lampGlb(true), readSideFile: async () => null },
      policy
    );
    const after = await lintAsset({ path: 'props/lamp.glb', bytes, readSideFile: async () => null }, policy);
    expect(before.findings.map((finding) => finding.rule)).toContain('hemisphere-jump');
    expect(after.findings.map((finding) => finding.rule)).not.toContain('hemisphere-jump');
  });

  it('refuses the fixed download to viewers (403) and to non-members (404)', async () => {
    const path = await lampAssetPath(builds.flipOnMain);
    expect((await get(`${path}/fixed`, cookies.viewer)).status).toBe(403);
    expect((await get(`${path}/fixed`, cookies.outsider)).status).toBe(404);
  });
});

/**
 * API token secrets at rest and in use: the database holds only a SHA-256 of each secret and a
 * short prefix (never the secret), a presented secret is compared in constant time
 * (crypto.timingSafeEqual over equal-length hashes), and refused tokens are braked per client
 * address: after 20 refused tokens in a minute, every token from that address gets 429 with
 * Retry-After until the window passes, a right one included.
 */
import crypto from 'node:crypto';
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import { Project } from '$lib/server/db/models';
import * as apiTokens from '$lib/server/tokens/api-tokens';
import { TOKEN_FAILURE_LIMIT } from '$lib/server/tokens/token-failure-guard';
import { diverGlb } from './api-fixtures';
import { postBuild, seedProject, startApiTestServer, type ApiTestServer } from './api-test-server';
import { openTempDatabase, type TempDatabase } from './temp-database';

describe('token secrets at rest and in use', () => {
  let temp: TempDatabase;
  let project: Project;

  beforeAll(async () => {
    temp = await openTempDatabase();
    project = await Project.create({ slug: 'lantern-quay', name: 'Lantern Quay', baseBranch: 'main' });
  });
  afterAll(async () => temp?.remove());
  afterEach(() => vi.restoreAllMocks());

  it('stores no secret: only its SHA-256 and the first 12 characters', async () => {
    const created = await apiTokens.create(project.id, 'CI main', null);
    const [rows] = await temp.database.sequelize.query('SELECT * FROM api_tokens WHERE id = ?', {
      replacements: [created.id]
    });
    const stored = JSON.stringify(rows);
    expect(stored).not.toContain(created.secret);
    // No 16-character run of the secret past the shown prefix appears anywhere in the row.
    const hidden = created.secret.slice(12);
    for (let start = 0; start + 16 <= hidden.length; start++) {
      expect(stored).not.toContain(hidden.slice(start, start + 16));
    }
    const row = (rows as { tokenHash: string; prefix: string }[])[0];
    // FIPS 180-4 SHA-256, computed here by Node's own crypto as the oracle.
    expect(row.tokenHash).toBe(crypto.createHash('sha256').update(created.secret).digest('hex'));
    expect(row.prefix).toBe(created.secret.slice(0, 12));
  });

  it('checks a presented secret with crypto.timingSafeEqual over two 32-byte hashes', async () => {
    const created = await apiTokens.create(project.id, 'CI nightly', null);
    const timingSafeEqual = vi.spyOn(crypto, 'timingSafeEqual');
    const token = await apiTokens.verify(`Bearer ${created.secret}`, project, 'submit');
    expect(token.id).toBe(created.id);
    expect(timingSafeEqual).toHaveBeenCalledTimes(1);
    const [presented, stored] = timingSafeEqual.mock.calls[0] as [Buffer, Buffer];
    expect([presented.length, stored.length]).toEqual([32, 32]);
  });

  it('refuses a secret one character off, through the same comparison path', async () => {
    const created = await apiTokens.create(project.id, 'CI release', null);
    const last = created.secret.at(-1) === 'A' ? 'B' : 'A';
    await expect(
      apiTokens.verify(`Bearer ${created.secret.slice(0, -1)}${last}`, project, 'submit')
    ).rejects.toMatchObject({ status: 401, code: 'auth.token-invalid' });
  });
});

describe('the refused-token brake on a real server', () => {
  let server: ApiTestServer;
  let secret: string;

  beforeAll(async () => {
    server = await startApiTestServer();
    ({ secret } = await seedProject('lantern-quay'));
  });
  afterAll(async () => server?.remove());

  it('answers 429 with Retry-After after 20 refused tokens a minute from one address, then refuses even the right token', async () => {
    const glb = await diverGlb();
    const wrong = `${secret.slice(0, -4)}zzzz`;
    for (let attempt = 0; attempt < TOKEN_FAILURE_LIMIT.maxFailures; attempt++) {
      const response = await postBuild(
        server,
        'lantern-quay',
        secret,
        [{ path: 'chars/diver.glb', bytes: glb }],
        undefined,
        {
          authorization: `Bearer ${wrong}`
        }
      );
      expect(response.status).toBe(401);
      await response.body?.cancel();
    }
    const reports = `${server.url}/api/v1/projects/lantern-quay/builds/1/report.json`;
    const blocked = await fetch(reports, { headers: { authorization: `Bearer ${wrong}` } });
    expect(blocked.status).toBe(429);
    const retryAfter = Number(blocked.headers.get('retry-after'));
    expect(retryAfter).toBeGreaterThan(0);
    expect(retryAfter).toBeLessThanOrEqual(TOKEN_FAILURE_LIMIT.windowSeconds);
    const body = (await blocked.json()) as { error: { code: string; message: string } };
    expect(body.error.code).toBe('auth.token-rate-limited');
    expect(body.error.message).toContain(`Wait ${retryAfter} s`);

    const right = await postBuild(server, 'lantern-quay', secret, [{ path: 'chars/diver.glb', bytes: glb }]);
    expect(right.status).toBe(429);
    await right.body?.cancel();
    // Requests without a token (health, the sign-in page) are not braked.
    expect((await fetch(`${server.url}/api/health`)).status).toBe(200);
    expect((await fetch(`${server.url}/signin`)).status).toBe(200);
  });
});

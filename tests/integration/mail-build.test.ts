/**
 * Build e-mails through the real server and a real SMTP conversation: the server runs with
 * SMTP_URL pointing at an SMTP server on loopback, and the tests read the MIME it received.
 * Also the links those e-mails carry: one-click unsubscribe and password reset.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { resetConfig } from '$lib/server/config';
import { Asset, MailMessage, User } from '$lib/server/db/models';
import { saveMailSettings } from '$lib/server/mail/mail-settings';
import { signUserToken } from '$lib/server/mail/signed-user-token';
import { diverGlb } from './api-fixtures';
import {
  postBuild,
  seedProject,
  seedUser,
  signIn,
  startApiTestServer,
  type ApiTestServer,
  type SeededUser,
  type UploadFile,
  type BuildAnswer
} from './api-test-server';
import { startSmtpSink, type SinkMessage, type SmtpSink } from './mail-smtp-sink';

/** The AUTH_SECRET the test server runs with (api-test-server.ts), so this process can sign links too. */
const AUTH_SECRET = 'api-test-secret-that-is-at-least-32-characters-long';
const NODE_NAME = '<script>alert(1)</script>';

let sink: SmtpSink;
let server: ApiTestServer;
let secret: string;
let lead: SeededUser;
let baseOnlyLead: SeededUser;
let subscriber: SeededUser;
let quietArtist: SeededUser;
let mutedViewer: SeededUser;

beforeAll(async () => {
  sink = await startSmtpSink();
  server = await startApiTestServer({ SMTP_URL: sink.url, MAIL_FROM: 'Orientry CI <ci@reef.example>' });
  lead = await seedUser('marin@reef.example', 'lead');
  baseOnlyLead = await seedUser('coral@reef.example', 'lead');
  subscriber = await seedUser('kelp@reef.example', 'artist');
  quietArtist = await seedUser('shoal@reef.example', 'artist');
  mutedViewer = await seedUser('tide@reef.example', 'viewer');
  const seeded = await seedProject('reef', [
    { user: lead, role: 'lead' },
    { user: baseOnlyLead, role: 'lead' },
    { user: subscriber, role: 'artist' },
    { user: quietArtist, role: 'artist' },
    { user: mutedViewer, role: 'viewer' }
  ]);
  secret = seeded.secret;
  const projectIds = [seeded.project.id];
  await saveMailSettings(baseOnlyLead.id, { preference: 'base', projectIds: [] });
  await saveMailSettings(subscriber.id, { preference: 'all', projectIds });
  await saveMailSettings(mutedViewer.id, { preference: 'none', projectIds });
  process.env.AUTH_SECRET = AUTH_SECRET;
  resetConfig();
}, 240_000);
afterAll(async () => {
  await server?.remove();
  await sink?.close();
  delete process.env.AUTH_SECRET;
  resetConfig();
});

async function submit(
  files: UploadFile[],
  meta: Record<string, unknown>
): Promise<{ status: number; body: BuildAnswer }> {
  const response = await postBuild(server, 'reef', secret, files, meta);
  return { status: response.status, body: (await response.json()) as BuildAnswer };
}

async function diverFiles(defect: 'none' | 'zero-key' = 'none'): Promise<UploadFile[]> {
  return [{ path: 'chars/kelp-diver.glb', bytes: await diverGlb({ defect, jointName: NODE_NAME }) }];
}

const queuedFor = (buildId: number) => MailMessage.findAll({ where: { buildId }, order: [['toAddress', 'ASC']] });
const recipientsOf = (messages: readonly SinkMessage[]) => messages.flatMap((message) => message.envelopeTo).sort();
const header = (message: SinkMessage, name: string) => String(message.parsed.headers.get(name) ?? '');
/** The header section with folded lines joined (RFC 5322 §2.2.3), one header per line. */
const headerSection = (message: SinkMessage) => message.raw.split('\r\n\r\n')[0].replace(/\r\n[ \t]+/g, ' ');
const unsubscribeLinkOf = (message: SinkMessage) =>
  /^List-Unsubscribe: <([^>]+)>$/m.exec(headerSection(message).replace(/\r\n/g, '\n'))?.[1];
const wait = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

/** Waits for `count` more messages than `before` and returns the new ones. */
async function newMessages(before: number, count: number): Promise<SinkMessage[]> {
  await sink.waitFor(before + count, 15_000);
  return sink.messages.slice(before);
}

describe('build e-mails', () => {
  let regressionId: number;
  let regression: SinkMessage[];

  it('sends nothing for a clean first build on the base branch', async () => {
    const { status, body } = await submit(await diverFiles(), { branch: 'main', label: 'r-100' });
    expect(status).toBe(201);
    expect(body.build.verdict).toBe('pass');
    // Mail is queued in the build's own transaction, so the answer already tells.
    expect(await queuedFor(body.build.id)).toHaveLength(0);
  });

  it('mails a regressing build once to each lead and subscriber who wants that branch', async () => {
    const before = sink.messages.length;
    const { status, body } = await submit(await diverFiles('zero-key'), {
      branch: 'feature/swim',
      label: 'r-101',
      commit: 'a1b2c3d4e5f60718293a4b5c6d7e8f9012345678'
    });
    expect(status).toBe(201);
    expect(body.build.verdict).toBe('fail');
    regressionId = body.build.id;
    const queued = await queuedFor(regressionId);
    // The lead and the subscribed artist: not the base-branch-only lead (feature branch), not the artist who did
    // not subscribe, not the viewer whose preference is none.
    expect(queued.map((message) => message.toAddress)).toEqual([subscriber.email, lead.email].sort());
    expect(queued.map((message) => message.dedupeKey).sort()).toEqual(
      [`build:${regressionId}:regression:${lead.id}`, `build:${regressionId}:regression:${subscriber.id}`].sort()
    );
    regression = await newMessages(before, 2);
    expect(recipientsOf(regression)).toEqual([subscriber.email, lead.email].sort());
  });

  it('names the project, branch, build and new-finding count in the subject and sends the configured From', () => {
    for (const message of regression) {
      expect(message.parsed.subject).toBe('[reef] feature/swim · build r-101 failed: 1 new finding');
      expect(message.parsed.from?.text).toBe('"Orientry CI" <ci@reef.example>');
      expect(header(message, 'auto-submitted')).toBe('auto-generated');
    }
  });

  it('carries a signed one-click unsubscribe link for its recipient (RFC 8058)', () => {
    for (const message of regression) {
      const user = message.envelopeTo[0] === lead.email ? lead : subscriber;
      expect(headerSection(message)).toMatch(/^List-Unsubscribe-Post: List-Unsubscribe=One-Click\r$/m);
      const listUnsubscribe = unsubscribeLinkOf(message);
      expect(listUnsubscribe).toMatch(new RegExp(`^${server.url}/unsubscribe/${user.id}\\.\\d+\\.[A-Za-z0-9_-]{43}$`));
      expect(message.parsed.text).toContain(`Stop these e-mails: ${listUnsubscribe}`);
      expect(message.parsed.html).toContain(`href="${listUnsubscribe}"`);
    }
  });

  it('lists the new finding with rule, node, time and message, and links the report and the asset, in both bodies', async () => {
    const [asset] = await Asset.findAll({ where: { buildId: regressionId } });
    const reportUrl = `${server.url}/projects/reef/builds/${regressionId}`;
    const assetUrl = `${reportUrl}/assets/${asset.id}`;
    for (const message of regression) {
      const text = message.parsed.text ?? '';
      expect(text).toContain(`Build report: ${reportUrl}\n`);
      expect(text).toContain(`chars/kelp-diver.glb\n  ${assetUrl}\n`);
      expect(text).toMatch(/- error not-a-rotation at \/Diver\/<script>alert\(1\)<\/script> · Swim · 1\.0 s\n/);
      expect(text).toContain('Commit: a1b2c3d4e5f60718293a4b5c6d7e8f9012345678');
      const html = String(message.parsed.html);
      expect(html).toContain(`href="${reportUrl}"`);
      expect(html).toContain(`href="${assetUrl}"`);
      expect(html).toContain('not-a-rotation');
    }
  });

  it('escapes a node named <script> in the HTML body', () => {
    for (const message of regression) {
      const html = String(message.parsed.html);
      expect(html).toContain('/Diver/&lt;script&gt;alert(1)&lt;/script&gt;');
      expect(html).not.toContain('<script');
    }
  });

  it('sends no second e-mail for a build re-submitted with the same idempotency key', async () => {
    const meta = { branch: 'feature/swim', label: 'r-102', idempotencyKey: 'ci-job-7781' };
    const before = sink.messages.length;
    const first = await submit(await diverFiles('zero-key'), meta);
    expect(first.status).toBe(201);
    await newMessages(before, 2);
    const again = await submit(await diverFiles('zero-key'), meta);
    expect(again.status).toBe(200);
    expect(again.body.build.id).toBe(first.body.build.id);
    // Longer than the worker's poll interval: anything queued would have gone out by now.
    await wait(3_000);
    expect(sink.messages).toHaveLength(before + 2);
    expect(await queuedFor(first.body.build.id)).toHaveLength(2);
  });

  it('mails a regression on the base branch to base-branch-only readers too, and then its fix', async () => {
    let before = sink.messages.length;
    const broken = await submit(await diverFiles('zero-key'), { branch: 'main', label: 'r-103' });
    expect(broken.body.build.verdict).toBe('fail');
    const regressed = await newMessages(before, 3);
    expect(recipientsOf(regressed)).toEqual([baseOnlyLead.email, subscriber.email, lead.email].sort());

    before = sink.messages.length;
    const fixed = await submit(await diverFiles(), { branch: 'main', label: 'r-104' });
    expect(fixed.body.build.verdict).toBe('pass');
    const fixes = await newMessages(before, 3);
    expect(fixes.map((message) => message.parsed.subject)).toEqual(
      Array(3).fill('[reef] main · build r-104: 1 finding fixed')
    );
    expect(fixes[0].parsed.text).toContain('Fixed since the baseline: 1');
    expect((await queuedFor(fixed.body.build.id)).map((message) => message.kind)).toEqual(Array(3).fill('build-fixed'));
  });
});

describe('unsubscribe links', () => {
  const linkOf = (message: SinkMessage) => unsubscribeLinkOf(message)!;
  /** The mail client's one-click request (RFC 8058 §3.1): a form POST with no session and no Accept preference. */
  const oneClick = async (url: string) => {
    const response = await fetch(url, {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded', origin: server.url },
      body: 'List-Unsubscribe=One-Click'
    });
    return { status: response.status, body: (await response.json()) as { type: string; status: number } };
  };
  /** The confirmation page's button, as a browser sends it. */
  const confirmInBrowser = (url: string) =>
    fetch(url, {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded', origin: server.url, accept: 'text/html' },
      body: ''
    });
  const open = async (url: string) => (await fetch(url, { headers: { accept: 'text/html' } })).text();
  const preferenceOf = async (user: SeededUser) => (await User.findByPk(user.id))!.mailPreference;

  it('opens a confirmation page that changes nothing by itself', async () => {
    const message = sink.messages.find((candidate) => candidate.envelopeTo[0] === subscriber.email)!;
    const page = await open(linkOf(message));
    expect(page).toContain('Stop build e-mails?');
    expect(page).toContain(subscriber.email);
    expect(await preferenceOf(subscriber)).toBe('all');
  });

  it('unsubscribes on the one-click POST, without a session', async () => {
    const message = sink.messages.find((candidate) => candidate.envelopeTo[0] === subscriber.email)!;
    const answer = await oneClick(linkOf(message));
    expect(answer.status).toBe(200);
    expect(answer.body).toMatchObject({ type: 'success', status: 200 });
    expect(await preferenceOf(subscriber)).toBe('none');
    expect(await open(linkOf(message))).toContain('You are unsubscribed');
  });

  it('unsubscribes from the confirmation page button', async () => {
    const message = sink.messages.find((candidate) => candidate.envelopeTo[0] === baseOnlyLead.email)!;
    const response = await confirmInBrowser(linkOf(message));
    expect(response.status).toBe(200);
    expect(await response.text()).toContain('You are unsubscribed');
    expect(await preferenceOf(baseOnlyLead)).toBe('none');
  });

  it('refuses a tampered link and leaves the preference alone', async () => {
    const message = sink.messages.find((candidate) => candidate.envelopeTo[0] === lead.email)!;
    // Someone else's id with the lead's signature.
    const tampered = linkOf(message).replace(`/unsubscribe/${lead.id}.`, `/unsubscribe/${quietArtist.id}.`);
    expect(await open(tampered)).toContain('This link does not work');
    expect((await oneClick(tampered)).body).toMatchObject({ type: 'failure', status: 400 });
    expect((await confirmInBrowser(tampered)).status).toBe(400);
    expect(await preferenceOf(quietArtist)).toBe('all');
    expect(await preferenceOf(lead)).toBe('all');
  });

  it('refuses an expired link', async () => {
    const token = signUserToken('unsubscribe', lead.id, new Date(Date.now() - 60_000));
    const url = `${server.url}/unsubscribe/${token}`;
    expect(await open(url)).toContain('This link has expired');
    expect((await oneClick(url)).body).toMatchObject({ type: 'failure', status: 400 });
    expect(await preferenceOf(lead)).toBe('all');
  });
});

describe('password reset by e-mail', () => {
  const requestReset = (email: string) =>
    fetch(`${server.url}/reset`, {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded', origin: server.url, accept: 'text/html' },
      body: new URLSearchParams({ email })
    });

  it('answers the same for an unknown address and mails nobody', async () => {
    const before = await MailMessage.count({ where: { kind: 'password-reset' } });
    const known = await (await requestReset(quietArtist.email)).text();
    const unknown = await (await requestReset('nobody@reef.example')).text();
    const answer = (page: string, email: string) => page.replaceAll(email, '<address>');
    expect(answer(unknown, 'nobody@reef.example')).toBe(answer(known, quietArtist.email));
    expect(await MailMessage.count({ where: { kind: 'password-reset' } })).toBe(before + 1);
  });

  it('mails a one-time link that sets a new password', async () => {
    const message = await (async () => {
      for (let tries = 0; tries < 150; tries++) {
        const found = sink.messages.find(
          (candidate) =>
            candidate.envelopeTo[0] === quietArtist.email && /password/i.test(candidate.parsed.subject ?? '')
        );
        if (found) return found;
        await wait(100);
      }
      throw new Error('No reset e-mail arrived.');
    })();
    const link = new RegExp(`${server.url}/reset/[^\\s]+`).exec(message.parsed.text ?? '')![0];
    expect(String(message.parsed.html)).toContain(`href="${link}"`);

    expect(await (await fetch(link)).text()).toContain('Choose a new password');
    const newPassword = 'a-brand-new-password';
    const response = await fetch(link, {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded', origin: server.url, accept: 'text/html' },
      body: new URLSearchParams({ password: newPassword, passwordAgain: newPassword })
    });
    expect(await response.text()).toContain('Password changed');
    await expect(signIn(server, { ...quietArtist, password: newPassword })).resolves.toMatch(/session-token=/);
    await expect(signIn(server, quietArtist)).rejects.toThrow(/failed/);
    expect(await (await fetch(link)).text()).toContain('This link does not work any more');
  });
});

describe('mail queue rows', () => {
  it('records every message it sent as sent, once', async () => {
    await wait(2_500);
    const rows = await server.database.sequelize.query<{ status: string; n: number }>(
      'SELECT status, COUNT(*) AS n FROM mail_messages GROUP BY status',
      { type: QueryTypes.SELECT }
    );
    expect(rows).toEqual([{ status: 'sent', n: sink.messages.length }]);
  });
});

import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { MailMessage } from '$lib/server/db/models';
import { createMailTransport } from '$lib/server/mail/mail-transport';
import { MailWorker, type MailWorkerOptions } from '$lib/server/mail/mail-worker';
import * as outbox from '$lib/server/mail/outbox';
import { claimNext } from '$lib/server/mail/outbox-lease';
import { startSmtpSink, type SmtpSink } from './mail-smtp-sink';
import { openDatabaseUnderTest, type DatabaseUnderTest } from './helpers/database-under-test';
import { freePort } from './helpers/server-process';

let temp: DatabaseUnderTest;
const sinks: SmtpSink[] = [];
const workers: MailWorker[] = [];

beforeAll(async () => {
  temp = await openDatabaseUnderTest();
});
afterAll(async () => {
  await temp.remove();
});
beforeEach(async () => {
  await MailMessage.destroy({ where: {} });
});
afterEach(async () => {
  await Promise.all(workers.splice(0).map((worker) => worker.stop()));
  await Promise.all(sinks.splice(0).map((sink) => sink.close()));
});

async function sink(options: Parameters<typeof startSmtpSink>[0] = {}): Promise<SmtpSink> {
  const started = await startSmtpSink(options);
  sinks.push(started);
  return started;
}

/** A fast worker for tests: polls every 20 ms and retries after 40 ms, 80 ms… */
function worker(port: number, options: Partial<MailWorkerOptions> = {}): MailWorker {
  const started = new MailWorker({
    transport: createMailTransport({ host: '127.0.0.1', port }),
    from: 'Orientry <orientry@localhost>',
    pollIntervalMs: 20,
    baseDelayMs: 40,
    maxDelayMs: 200,
    log: () => undefined,
    ...options
  });
  workers.push(started);
  return started;
}

async function queue(key: string, to = 'tomasz@lanternfish.example'): Promise<void> {
  await outbox.enqueue({
    kind: 'test',
    toAddress: to,
    subject: `Message ${key}`,
    textBody: `Body of ${key}`,
    htmlBody: `<p>Body of ${key}</p>`,
    dedupeKey: key
  });
}

async function until<T>(read: () => Promise<T>, isDone: (value: T) => boolean, timeoutMs = 10_000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await read();
    if (isDone(value)) return value;
    if (Date.now() > deadline) throw new Error(`Timed out; last value: ${JSON.stringify(value)}`);
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
}

const message = (key: string) => MailMessage.findOne({ where: { dedupeKey: key } }).then((row) => row!);

describe('mail worker', () => {
  it('sends a queued message once and records it as sent', async () => {
    const smtp = await sink();
    await queue('once');
    worker(smtp.port).start();
    const [received] = await smtp.waitFor(1);
    expect(received.parsed.subject).toBe('Message once');
    expect(received.envelopeTo).toEqual(['tomasz@lanternfish.example']);
    const row = await until(
      () => message('once'),
      (row) => row.status === 'sent'
    );
    expect(row.attempts).toBe(1);
    expect(row.sentAt).toBeInstanceOf(Date);
    expect(row.leaseOwner).toBeNull();
    expect(received.parsed.messageId).toMatch(new RegExp(`^<outbox-${row.id}\\.[0-9a-f]{12}@localhost>$`));
  });

  it('keeps one message for a dedupe key queued twice', async () => {
    await queue('twice');
    expect(
      await outbox.enqueue({
        kind: 'test',
        toAddress: 'a@b.example',
        subject: 's',
        textBody: 't',
        htmlBody: null,
        dedupeKey: 'twice'
      })
    ).toBe(false);
    expect(await MailMessage.count({ where: { dedupeKey: 'twice' } })).toBe(1);
  });

  it('retries while the SMTP server is down and delivers exactly once when it comes up', async () => {
    const port = await freePort();
    await queue('down-then-up');
    worker(port).start();
    // Two failed attempts recorded: the message is queued again with its error.
    const waiting = await until(
      () => message('down-then-up'),
      (row) => row.attempts >= 2 && row.status === 'queued'
    );
    expect(waiting.lastError ?? '').toMatch(/ECONNREFUSED|connect/i);

    const smtp = await sink({ port });
    await smtp.waitFor(1);
    const sent = await until(
      () => message('down-then-up'),
      (row) => row.status === 'sent'
    );
    // Several more polls: nothing else may arrive.
    await new Promise((resolve) => setTimeout(resolve, 300));
    expect(smtp.messages).toHaveLength(1);
    expect(sent.lastError).toBeNull();
    expect(sent.attempts).toBeGreaterThanOrEqual(3);
  });

  it('marks a message failed with its last error once its attempts run out', async () => {
    const smtp = await sink({ refuseWith: [451, 'Mailbox busy, try later'] });
    await queue('busy');
    worker(smtp.port, { maxAttempts: 3 }).start();
    const failed = await until(
      () => message('busy'),
      (row) => row.status === 'failed'
    );
    expect(failed.attempts).toBe(3);
    expect(failed.lastError).toMatch(/^Attempt 3: .*451.*Mailbox busy/);
    expect(smtp.messages).toHaveLength(0);
  });

  it('fails at once when the server refuses the recipient for good (5xx)', async () => {
    const smtp = await sink({ refuseWith: [550, 'No such mailbox'] });
    await queue('unknown-mailbox', 'nobody@lanternfish.example');
    worker(smtp.port).start();
    const failed = await until(
      () => message('unknown-mailbox'),
      (row) => row.status === 'failed'
    );
    expect(failed.attempts).toBe(1);
    expect(failed.lastError).toMatch(/550.*No such mailbox/);
  });

  it('never lets two workers send the same message', async () => {
    const smtp = await sink();
    for (let index = 0; index < 24; index++) await queue(`shared-${index}`);
    worker(smtp.port, { owner: 'server-a' }).start();
    worker(smtp.port, { owner: 'server-b' }).start();
    await smtp.waitFor(24);
    await until(
      () => MailMessage.count({ where: { status: 'sent' } }),
      (count) => count === 24
    );
    await new Promise((resolve) => setTimeout(resolve, 200));
    const subjects = smtp.messages.map((received) => received.parsed.subject);
    expect(subjects).toHaveLength(24);
    expect(new Set(subjects).size).toBe(24);
    const rows = await MailMessage.findAll();
    expect(rows.every((row) => row.attempts === 1)).toBe(true);
  });

  it('leaves a message leased by another worker alone until the lease runs out', async () => {
    const smtp = await sink();
    await queue('leased');
    const now = new Date();
    const claimed = await claimNext('crashed-server', now, 60_000);
    expect(claimed?.dedupeKey).toBe('leased');

    const taker = worker(smtp.port, { owner: 'taker' });
    expect(await taker.runOnce(() => now)).toBe(0);
    expect(smtp.messages).toHaveLength(0);

    // The crashed server never comes back: after its lease another worker sends the message.
    const later = new Date(now.getTime() + 61_000);
    expect(await taker.runOnce(() => later)).toBe(1);
    expect(smtp.messages).toHaveLength(1);
    const row = await message('leased');
    expect(row.status).toBe('sent');
    expect(row.attempts).toBe(2);
  });
});

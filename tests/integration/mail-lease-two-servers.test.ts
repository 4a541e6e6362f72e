/**
 * Two real servers (`node build`) on one database each run a mail worker, as a studio running
 * several app servers behind a load balancer does. Their leases on outbox rows must keep them
 * from sending any message twice. Each server is given its own SMTP server on loopback, so every
 * message that arrives says which server sent it: the test sees both servers send, and each
 * message arrive exactly once across the two. Runs on SQLite (both servers on one file) and, in
 * the PostgreSQL pass, on one PostgreSQL database.
 */
import type { ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import type net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { SMTPServer } from 'smtp-server';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MailMessage } from '$lib/server/db/models';
import * as outbox from '$lib/server/mail/outbox';
import { dialectUnderTest, openDatabaseUnderTest, type DatabaseUnderTest } from './helpers/database-under-test';
import { copyOfBuild, freePort, launchServer, stopChild } from './helpers/server-process';

const MESSAGE_COUNT = 40;
/**
 * How long each SMTP server holds a message before accepting it. Workers poll every 2 s and send
 * one message at a time, so 40 messages at 100 ms keep one worker busy for 4 s: long enough that
 * the other server's worker wakes up while messages are still due, and both really race.
 */
const ACCEPT_DELAY_MS = 100;

/** A loopback SMTP server that records the Subject of every message it accepts. */
interface RecordingSmtp {
  url: string;
  subjects: string[];
  close(): Promise<void>;
}

async function startRecordingSmtp(): Promise<RecordingSmtp> {
  const subjects: string[] = [];
  const server = new SMTPServer({
    secure: false,
    disabledCommands: ['STARTTLS'],
    authOptional: true,
    logger: false,
    onData(stream, _session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('end', () => {
        const subject = /^Subject: (.*)$/im.exec(Buffer.concat(chunks).toString('utf8'))?.[1]?.trim() ?? '';
        setTimeout(() => {
          subjects.push(subject);
          callback();
        }, ACCEPT_DELAY_MS);
      });
    }
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => resolve());
  });
  const { port } = server.server.address() as net.AddressInfo;
  return {
    url: `smtp://127.0.0.1:${port}`,
    subjects,
    close: () => new Promise<void>((resolve) => server.close(() => resolve()))
  };
}

/** One `node build` process. */
interface AppServer {
  child: ChildProcess;
  dataDir: string;
  output: string[];
}

let database: DatabaseUnderTest;
let buildDir: string;
const smtps: RecordingSmtp[] = [];
const servers: AppServer[] = [];

beforeAll(async () => {
  // The test process migrates first; both servers then find the schema current.
  database = await openDatabaseUnderTest();
  buildDir = await copyOfBuild('lease-build');
  for (let index = 0; index < 2; index++) smtps.push(await startRecordingSmtp());
  for (const smtp of smtps) servers.push(await startAppServer(smtp.url));
});

afterAll(async () => {
  for (const server of servers) {
    await stopChild(server.child);
    fs.rmSync(server.dataDir, { recursive: true, force: true });
  }
  for (const smtp of smtps) await smtp.close();
  await database?.remove();
  if (buildDir) fs.rmSync(buildDir, { recursive: true, force: true });
});

describe(`two servers sharing one ${dialectUnderTest() === 'postgres' ? 'PostgreSQL database' : 'SQLite file'}`, () => {
  it('send every queued message exactly once between them, and both take part', async () => {
    for (let index = 0; index < MESSAGE_COUNT; index++) {
      await outbox.enqueue({
        kind: 'lease-test',
        toAddress: `crew-${index}@lanternfish.example`,
        subject: `Lease check ${index}`,
        textBody: `Message ${index} of ${MESSAGE_COUNT}.`,
        htmlBody: null,
        dedupeKey: `lease-test:${index}`
      });
    }
    const deadline = Date.now() + 60_000;
    while ((await MailMessage.count({ where: { kind: 'lease-test', status: 'sent' } })) < MESSAGE_COUNT) {
      if (Date.now() > deadline) {
        throw new Error(`Not every message was sent within 60 s:\n${servers.flatMap((s) => s.output).join('\n')}`);
      }
      await new Promise((resolve) => setTimeout(resolve, 200));
    }
    // A worker records `sent` only after the SMTP server accepted the message; a copy sent twice
    // would have been accepted before the second `sent`, so nothing more can arrive now.
    const received = smtps.flatMap((smtp) => smtp.subjects);
    expect(received).toHaveLength(MESSAGE_COUNT);
    expect(new Set(received)).toEqual(new Set(Array.from({ length: MESSAGE_COUNT }, (_, i) => `Lease check ${i}`)));
    expect(
      smtps.map((smtp) => smtp.subjects.length).every((count) => count > 0),
      'both servers sent mail'
    ).toBe(true);
    const rows = await MailMessage.findAll({ where: { kind: 'lease-test' } });
    expect(rows.map((row) => row.attempts)).toEqual(rows.map(() => 1));
  });
});

async function startAppServer(smtpUrl: string): Promise<AppServer> {
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'orientry-lease-'));
  const url = `http://127.0.0.1:${await freePort()}`;
  const output: string[] = [];
  const env = {
    ...process.env,
    NODE_ENV: 'production',
    AUTH_SECRET: 'lease-test-secret-that-is-at-least-32-characters',
    PORT: new URL(url).port,
    HOST: '127.0.0.1',
    ORIGIN: url,
    DATA_DIR: dataDir,
    DATABASE_URL: database.url,
    SMTP_URL: smtpUrl
  };
  return { child: await launchServer({ buildDir, env, url, output }), dataDir, output };
}

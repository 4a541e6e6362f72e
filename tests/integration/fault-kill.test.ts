/**
 * A server killed with SIGKILL in the middle of a submission, twice: once while the body is half
 * sent, once after the whole body arrived while the server lints it (the last file is a rig of
 * 2 million keys, about a second of lint). Each time the restarted server shows no trace of the
 * build (no rows, the upload folder swept by the next upload), the re-submission with the same
 * idempotency key completes as a new build, a third submission answers that same build, and the
 * lead is e-mailed about it exactly once (a real SMTP conversation on loopback).
 */
import { Document, WebIO } from '@gltf-transform/core';
import fs from 'node:fs';
import http from 'node:http';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Build, MailMessage } from '$lib/server/db/models';
import { rawMultipart, filePart, metaPart } from '../support/fuzz/raw-multipart';
import { aboutY, diverGlb } from './api-fixtures';
import {
  countBuildRows,
  listUploadFolders,
  seedProject,
  seedUser,
  startApiTestServer,
  type ApiTestServer
} from './api-test-server';
import { startSmtpSink, type SmtpSink } from './mail-smtp-sink';

const HEAVY_KEY_COUNT = 2_000_000;

let sink: SmtpSink;
let server: ApiTestServer;
let secret: string;
let heavyGlb: Uint8Array;

/**
 * A rig whose one LINEAR channel turns 0.0001° about +Y per key for 2 million keys
 * (q = [0, sin(θ/2), 0, cos(θ/2)], Shoemake 1985): clean, just long to lint.
 */
async function buildHeavyGlb(): Promise<Uint8Array> {
  const document = new Document();
  const buffer = document.createBuffer();
  const node = document.createNode('Mast');
  document.createScene('Quay').addChild(node);
  const times = new Float32Array(HEAVY_KEY_COUNT);
  const values = new Float32Array(HEAVY_KEY_COUNT * 4);
  for (let key = 0; key < HEAVY_KEY_COUNT; key++) {
    times[key] = key / 30;
    values.set(aboutY((key * 0.0001) % 360), key * 4);
  }
  const input = document.createAccessor().setType('SCALAR').setArray(times).setBuffer(buffer);
  const output = document.createAccessor().setType('VEC4').setArray(values).setBuffer(buffer);
  const sampler = document.createAnimationSampler().setInput(input).setOutput(output).setInterpolation('LINEAR');
  document
    .createAnimation('Drift')
    .addSampler(sampler)
    .addChannel(document.createAnimationChannel().setTargetNode(node).setTargetPath('rotation').setSampler(sampler));
  return new WebIO().writeBinary(document);
}

beforeAll(async () => {
  sink = await startSmtpSink();
  server = await startApiTestServer({ SMTP_URL: sink.url, MAIL_FROM: 'Orientry CI <ci@quay.example>' });
  const lead = await seedUser('harbourmaster@quay.example', 'lead');
  ({ secret } = await seedProject('quay', [{ user: lead, role: 'lead' }]));
  heavyGlb = await buildHeavyGlb();
}, 240_000);

afterAll(async () => {
  await server?.remove();
  await sink?.close();
});

/** The multipart body of a build: a diver with a zero key (so the lead gets mail), then `extra`. */
async function buildBody(key: string, label: string, extra: Uint8Array | null, boundary: string): Promise<Buffer> {
  const meta = JSON.stringify({ branch: 'fault/kill', label, idempotencyKey: key });
  const parts = [metaPart(meta), filePart('chars/diver.glb', await diverGlb({ defect: 'zero-key', jointName: label }))];
  if (extra) parts.push(filePart('rigs/mast.glb', extra));
  return rawMultipart(parts, boundary);
}

/** Sends a build through Node's http client; resolves with its status and body, or null if the socket died first. */
function send(
  body: Buffer,
  key: string,
  boundary: string,
  onBodyWritten: (request: http.ClientRequest) => void = () => {},
  bytesToSend = body.length
): Promise<{ status: number; text: string } | null> {
  const url = new URL(`${server.url}/api/v1/projects/quay/builds`);
  return new Promise((resolve) => {
    const request = http.request({
      host: url.hostname,
      port: url.port,
      path: url.pathname,
      method: 'POST',
      headers: {
        authorization: `Bearer ${secret}`,
        origin: server.url,
        'idempotency-key': key,
        'content-type': `multipart/form-data; boundary=${boundary}`,
        'content-length': String(body.length)
      }
    });
    request.on('error', () => resolve(null));
    request.on('response', (response) => {
      let text = '';
      response.setEncoding('utf8');
      response.on('data', (chunk: string) => (text += chunk));
      response.on('end', () => resolve({ status: response.statusCode!, text }));
      response.on('error', () => resolve(null));
    });
    request.write(body.subarray(0, bytesToSend), () => onBodyWritten(request));
  });
}

/** Waits until `check` holds, polling every 20 ms, or fails after `timeoutMs`. */
async function waitFor(check: () => boolean | Promise<boolean>, what: string, timeoutMs = 15_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (!(await check())) {
    if (Date.now() > deadline) throw new Error(`Timed out waiting for ${what}.`);
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
}

/** Size of a file in bytes, or -1 while it does not exist. */
function sizeOf(file: string): number {
  try {
    return fs.statSync(file).size;
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'ENOENT') return -1;
    throw error;
  }
}

async function killServer(): Promise<void> {
  const exited = new Promise((resolve) => server.child.once('exit', resolve));
  server.child.kill('SIGKILL');
  await exited;
}

/** Submits `key` whole and returns the answer's status and build id. */
async function submitWhole(key: string, label: string, extra: Uint8Array | null) {
  const boundary = `----orientry-fault-${key}-whole`;
  const answer = await send(await buildBody(key, label, extra, boundary), key, boundary);
  expect(answer, 'no answer to a whole submission').not.toBeNull();
  return { status: answer!.status, buildId: (JSON.parse(answer!.text) as { build: { id: number } }).build.id };
}

/** After a kill and restart: nothing of `key` is stored, re-submitting completes, and the lead is mailed once. */
async function expectCleanRecovery(key: string, label: string, extra: Uint8Array | null, rowsBefore: object) {
  await server.restart();
  expect(await countBuildRows(server.database)).toEqual(rowsBefore);
  expect(await Build.count({ where: { idempotencyKey: key } })).toBe(0);

  const mailBefore = sink.messages.length;
  const first = await submitWhole(key, label, extra);
  expect(first.status).toBe(201);
  expect(listUploadFolders(server)).toEqual([]);
  const build = await Build.findByPk(first.buildId);
  expect(build).toMatchObject({ idempotencyKey: key, assetCount: extra ? 2 : 1, verdict: 'fail' });

  const again = await submitWhole(key, label, extra);
  expect(again).toEqual({ status: 200, buildId: first.buildId });
  expect(await Build.count({ where: { idempotencyKey: key } })).toBe(1);

  await sink.waitFor(mailBefore + 1, 20_000);
  // The worker polls every 2 s: wait past two polls for any second copy.
  await new Promise((resolve) => setTimeout(resolve, 4_500));
  const aboutBuild = sink.messages.slice(mailBefore).filter((message) => message.parsed.subject?.includes(label));
  expect(aboutBuild.map((message) => message.envelopeTo)).toEqual([['harbourmaster@quay.example']]);
  const queued = await MailMessage.findAll({ where: { buildId: first.buildId } });
  expect(queued.map((message) => [message.status, message.attempts])).toEqual([['sent', 1]]);
}

describe('a server killed in the middle of a submission', () => {
  it('while the body is half sent: no trace, and the same key then completes with one e-mail', async () => {
    const rowsBefore = await countBuildRows(server.database);
    const key = 'ci-kill-mid-body';
    const boundary = `----orientry-fault-${key}`;
    const body = await buildBody(key, 'b-mid-body', heavyGlb, boundary);
    const answer = send(body, key, boundary, () => {}, Math.floor(body.length / 2));
    await waitFor(() => listUploadFolders(server).length === 1, 'the upload folder to appear');
    await killServer();
    expect(await answer).toBeNull();
    await expectCleanRecovery(key, 'b-mid-body', null, rowsBefore);
  });

  it('after the whole body arrived, while the server lints it: no trace, and the same key then completes with one e-mail', async () => {
    const rowsBefore = await countBuildRows(server.database);
    const key = 'ci-kill-while-linting';
    const boundary = `----orientry-fault-${key}`;
    const body = await buildBody(key, 'b-linting', heavyGlb, boundary);
    let answered = false;
    const answer = send(body, key, boundary, (request) => request.end()).then((result) => {
      answered = result !== null;
      return result;
    });
    // The last byte is on the wire once the upload folder holds the rig's file in full.
    await waitFor(
      () =>
        listUploadFolders(server).some(
          (folder) =>
            sizeOf(path.join(server.dataDir, 'uploads', folder, 'files', 'rigs', 'mast.glb')) === heavyGlb.byteLength
        ),
      'the whole body to arrive'
    );
    await new Promise((resolve) => setTimeout(resolve, 100));
    expect(answered, 'the server answered before the kill: give it more to lint').toBe(false);
    await killServer();
    expect(await answer).toBeNull();
    await expectCleanRecovery(key, 'b-linting', heavyGlb, rowsBefore);
  });
});

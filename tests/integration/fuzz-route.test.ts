/**
 * Fuzzes the build submission route of a real server (production build, SQLite, its own
 * DATA_DIR): 200 hostile uploads from fixed seeds, one build each. 160 carry a damaged or hostile
 * asset from tests/support/fuzz/bad-files.ts (about 11 of each of its 15 kinds; the engine test
 * covers 1,200 files in-process), 40 a hostile multipart envelope around a valid asset
 * (tests/support/fuzz/bad-envelopes.ts).
 *
 * Each must be answered within 5 seconds with 201 (the build stored, the asset carrying one
 * `asset-unreadable` finding with a known code or normal findings) or a 4xx JSON error; never a
 * 5xx, a hang or a dropped connection. The server stays up and its peak resident set stays within
 * 1 GiB of where it started. Canary files wait where `..` and absolute URIs would land (the data
 * folder, the uploads folder, a folder outside the data folder): none is ever read.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Asset, FindingRecord } from '$lib/server/db/models';
import { generateBadEnvelopes, type BadEnvelope } from '../support/fuzz/bad-envelopes';
import { generateBadFiles, type FuzzCase } from '../support/fuzz/bad-files';
import { doesFileSystemRecordReads, placeCanary, wasCanaryRead } from '../support/fuzz/canary-files';
import { CANARY_NAME } from '../support/fuzz/hostile-uris';
import { outcomeProblems } from '../support/fuzz/check-outcome';
import { peakRssBytesOf, rssBytesOf } from '../support/fuzz/memory-probe';
import { buildSeedAssets, type SeedAssets } from '../support/fuzz/seed-assets';
import { listUploadFolders, seedProject, startApiTestServer, type ApiTestServer } from './api-test-server';

const FILE_SEED = 0x726f7574;
const ENVELOPE_SEED = 0x656e7665;
const FILE_CASES = 160;
const ENVELOPE_CASES = 40;
const ANSWER_LIMIT_MS = 5_000;
const MIB = 1024 * 1024;
const PEAK_RSS_GROWTH_LIMIT_BYTES = 1024 * MIB;

/** What one upload got back. */
interface Answer {
  label: string;
  status: number | null;
  elapsedMs: number;
  body: unknown;
  failure: string | null;
}

let server: ApiTestServer;
let secret: string;
let seed: SeedAssets;
let outsideFolder: string;
let canaries: string[] = [];
let startRssBytes = 0;
const fileAnswers: { fuzzCase: FuzzCase; answer: Answer }[] = [];
const envelopeAnswers: { envelope: BadEnvelope; answer: Answer }[] = [];

/** Sends one request with a 5 s deadline and reads its answer as JSON. */
async function send(label: string, body: FormData | Buffer, contentType?: string): Promise<Answer> {
  const startedAt = performance.now();
  try {
    const response = await fetch(`${server.url}/api/v1/projects/fuzz-harbor/builds`, {
      method: 'POST',
      body: body as BodyInit,
      headers: {
        authorization: `Bearer ${secret}`,
        origin: server.url,
        accept: 'application/json',
        ...(contentType ? { 'content-type': contentType } : {})
      },
      signal: AbortSignal.timeout(ANSWER_LIMIT_MS)
    });
    const text = await response.text();
    let parsed: unknown = text;
    try {
      parsed = JSON.parse(text);
    } catch {
      // Kept as text: the check below reports a non-JSON answer as a failure.
    }
    return { label, status: response.status, elapsedMs: performance.now() - startedAt, body: parsed, failure: null };
  } catch (error) {
    const failure = `${(error as Error).name}: ${(error as Error).message}`;
    return { label, status: null, elapsedMs: performance.now() - startedAt, body: null, failure };
  }
}

beforeAll(async () => {
  seed = await buildSeedAssets();
  server = await startApiTestServer();
  ({ secret } = await seedProject('fuzz-harbor'));
  outsideFolder = fs.mkdtempSync(path.join(os.tmpdir(), 'orientry-fuzz-outside-'));
  canaries = [
    placeCanary(path.join(server.dataDir, CANARY_NAME)),
    placeCanary(path.join(server.dataDir, 'uploads', CANARY_NAME)),
    placeCanary(path.join(outsideFolder, CANARY_NAME))
  ];
  startRssBytes = rssBytesOf(server.child.pid!)!;

  const absoluteTargets = canaries;
  for (const fuzzCase of generateBadFiles(seed, FILE_SEED, FILE_CASES, {
    absoluteTargets,
    maxDataUriLength: 4 * MIB
  })) {
    const form = new FormData();
    form.append('meta', JSON.stringify({ branch: 'fuzz', label: `case ${fuzzCase.index}` }));
    form.append('file', new Blob([fuzzCase.bytes as BlobPart]), `fuzz/${fuzzCase.name}`);
    for (const [name, bytes] of Object.entries(fuzzCase.sideFiles)) {
      form.append('file', new Blob([bytes as BlobPart]), `fuzz/${name}`);
    }
    fileAnswers.push({ fuzzCase, answer: await send(`#${fuzzCase.index} ${fuzzCase.kind}`, form) });
  }
  for (const envelope of generateBadEnvelopes(ENVELOPE_SEED, ENVELOPE_CASES, seed.glb)) {
    const answer = await send(
      `envelope #${envelope.index} ${envelope.description}`,
      envelope.body,
      envelope.contentType
    );
    envelopeAnswers.push({ envelope, answer });
  }
}, 240_000);

afterAll(async () => {
  await server?.remove();
  if (outsideFolder) fs.rmSync(outsideFolder, { recursive: true, force: true });
});

/** Problems with an answer that must be 201 or a 4xx JSON error, within the time limit. */
function answerProblems(answer: Answer): string[] {
  if (answer.failure) return [`no answer: ${answer.failure}`];
  const problems: string[] = [];
  if (answer.elapsedMs > ANSWER_LIMIT_MS) problems.push(`answered after ${Math.round(answer.elapsedMs)} ms`);
  const status = answer.status!;
  if (status === 201) return problems;
  if (status < 400 || status >= 500) return [...problems, `status ${status}: ${JSON.stringify(answer.body)}`];
  const error = (answer.body as { error?: { code?: unknown; message?: unknown } })?.error;
  if (typeof error?.code !== 'string' || typeof error.message !== 'string' || error.message.length === 0) {
    problems.push(`status ${status} without { error: { code, message } }: ${JSON.stringify(answer.body)}`);
  }
  return problems;
}

describe('the submission route under 200 fuzzed uploads from fixed seeds', () => {
  it('answers every upload within 5 seconds with 201 or a 4xx JSON error', () => {
    const problems = [...fileAnswers, ...envelopeAnswers].flatMap(({ answer }) =>
      answerProblems(answer).map((problem) => `${answer.label}: ${problem}`)
    );
    expect(problems.slice(0, 20)).toEqual([]);
    expect(fileAnswers).toHaveLength(FILE_CASES);
    expect(envelopeAnswers).toHaveLength(ENVELOPE_CASES);
  });

  it('stores each accepted asset with one asset-unreadable finding or normal findings', async () => {
    const stored = fileAnswers.filter(({ answer }) => answer.status === 201);
    // Damaged assets are findings, not refusals: the upload itself was well-formed.
    expect(stored.length).toBeGreaterThan(FILE_CASES * 0.9);
    const problems: string[] = [];
    for (const { fuzzCase, answer } of stored) {
      const buildId = (answer.body as { build: { id: number } }).build.id;
      const asset = await Asset.findOne({ where: { buildId, path: `fuzz/${fuzzCase.name}` } });
      if (!asset) {
        problems.push(`${answer.label}: build ${buildId} has no asset fuzz/${fuzzCase.name}`);
        continue;
      }
      const records = await FindingRecord.findAll({ where: { assetId: asset.id, status: ['new', 'unchanged'] } });
      const findings = records.map((record) => ({
        rule: record.rule,
        severity: record.severity,
        message: record.message,
        hint: record.hint,
        values: record.valuesJson ? JSON.parse(record.valuesJson) : null
      }));
      for (const problem of outcomeProblems({ unreadable: asset.unreadable, findings })) {
        problems.push(`${answer.label}: ${problem}`);
      }
    }
    expect(problems.slice(0, 20)).toEqual([]);
  });

  it('refuses every hostile envelope that is not a well-formed upload with a 4xx', () => {
    const refused = envelopeAnswers.filter(({ answer }) => answer.status !== null && answer.status >= 400);
    expect(refused.length).toBeGreaterThan(ENVELOPE_CASES * 0.6);
  });

  it('stays up, leaves no upload folder behind and keeps its peak memory within 1 GiB of the start', async () => {
    const lastLines = server.output.slice(-30).join('\n');
    expect(server.child.exitCode, lastLines).toBeNull();
    expect(server.child.signalCode, lastLines).toBeNull();
    expect((await fetch(`${server.url}/api/health`)).status).toBe(200);
    expect(listUploadFolders(server).filter((name) => name !== CANARY_NAME)).toEqual([]);
    const peak = peakRssBytesOf(server.child.pid!)!;
    console.info(
      `fuzz-route: ${fileAnswers.length + envelopeAnswers.length} uploads, slowest ${Math.round(
        Math.max(...[...fileAnswers, ...envelopeAnswers].map(({ answer }) => answer.elapsedMs))
      )} ms; server RSS ${Math.round(startRssBytes / MIB)} MiB at start, peak ${Math.round(peak / MIB)} MiB`
    );
    expect(peak - startRssBytes).toBeLessThan(PEAK_RSS_GROWTH_LIMIT_BYTES);
  });

  it('never reads a canary outside the upload folder, though URIs aimed at every one of them', () => {
    expect(doesFileSystemRecordReads(outsideFolder)).toBe(true);
    const aimed = fileAnswers.filter(({ fuzzCase }) => fuzzCase.hostileUri?.isOutside);
    expect(aimed.length).toBeGreaterThan(5);
    expect(canaries.filter(wasCanaryRead)).toEqual([]);
  });

  it('writes no hostile file name outside the upload folder', () => {
    for (const folder of [server.dataDir, path.dirname(server.dataDir), outsideFolder, process.cwd(), '/']) {
      expect(fs.existsSync(path.join(folder, 'escaped.glb')), folder).toBe(false);
    }
  });
});

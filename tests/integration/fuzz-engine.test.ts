/**
 * Fuzzes the lint engine: 1,200 damaged and hostile files (80 of each of the 15 kinds in
 * tests/support/fuzz/bad-files.ts) from one fixed seed go through `lintAsset` in this process.
 *
 * Each must end in a clear outcome (one `asset-unreadable` finding with a known code, or normal
 * findings), never a throw, within 5 seconds. Every side-file request is recorded: none may name
 * a path outside the asset's folder, and a URI that can only point outside must be refused with
 * a URI code before any read. Memory: the heap kept after the run (after a full collection) may
 * grow by at most 64 MiB, and the resident set may peak at most 1 GiB above where it started
 * (the reader's own decode budget allows 256 MiB plus four times the file for one file).
 */
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { defaultPolicy, lintAsset, type AssetReport } from '$lib/lint/index';
import { FUZZ_KINDS, generateBadFiles, type FuzzCase } from '../support/fuzz/bad-files';
import { outcomeProblems, unreadableCodeOf } from '../support/fuzz/check-outcome';
import { retainedHeapBytes } from '../support/fuzz/memory-probe';
import { buildSeedAssets, type SeedAssets } from '../support/fuzz/seed-assets';

const FUZZ_SEED = 0x6f726965;
const CASE_COUNT = 1_200;
const PER_FILE_LIMIT_MS = 5_000;
const MIB = 1024 * 1024;
const RETAINED_HEAP_LIMIT_BYTES = 64 * MIB;
const PEAK_RSS_GROWTH_LIMIT_BYTES = 1024 * MIB;
/** Absolute canary paths some hostile URIs aim at; the engine never sees a real file system. */
const ABSOLUTE_TARGETS = ['/srv/orientry/data/canary.bin', '/tmp/canary.bin'];

/** What one case did. */
interface CaseRun {
  fuzzCase: FuzzCase;
  report: AssetReport | null;
  error: unknown;
  elapsedMs: number;
  requested: string[];
}

let seed: SeedAssets;
const runs: CaseRun[] = [];
let heapBefore = 0;
let heapAfter = 0;
let rssBefore = 0;
let rssPeak = 0;
let totalMs = 0;

/** True when a side-file path handed to the caller stays inside the asset's folder. */
function isInsideFolder(relativePath: string): boolean {
  if (relativePath.length === 0 || relativePath.includes('\\') || relativePath.includes('\u0000')) return false;
  if (path.posix.isAbsolute(relativePath) || /^[a-z][a-z0-9+.-]*:/i.test(relativePath)) return false;
  const normalized = path.posix.normalize(relativePath);
  return normalized !== '..' && !normalized.startsWith('../') && relativePath.split('/').every((s) => s !== '..');
}

beforeAll(async () => {
  seed = await buildSeedAssets();
  const policy = defaultPolicy();
  heapBefore = retainedHeapBytes();
  rssBefore = process.memoryUsage.rss();
  rssPeak = rssBefore;
  const startedAt = performance.now();
  for (const fuzzCase of generateBadFiles(seed, FUZZ_SEED, CASE_COUNT, { absoluteTargets: ABSOLUTE_TARGETS })) {
    const requested: string[] = [];
    const source = {
      path: `fuzz/${fuzzCase.name}`,
      bytes: fuzzCase.bytes,
      async readSideFile(relativePath: string) {
        requested.push(relativePath);
        return fuzzCase.sideFiles[relativePath] ?? null;
      }
    };
    const caseStartedAt = performance.now();
    let report: AssetReport | null = null;
    let error: unknown = null;
    try {
      report = await lintAsset(source, policy);
    } catch (caught) {
      error = caught;
    }
    runs.push({ fuzzCase, report, error, elapsedMs: performance.now() - caseStartedAt, requested });
    rssPeak = Math.max(rssPeak, process.memoryUsage.rss());
  }
  totalMs = performance.now() - startedAt;
  heapAfter = retainedHeapBytes();
}, 180_000);

/** One line per failing case, at most 20, for the assertion message. */
function describeFailures(failures: { run: CaseRun; problem: string }[]): string[] {
  return failures
    .slice(0, 20)
    .map(({ run, problem }) => `#${run.fuzzCase.index} ${run.fuzzCase.kind} (${run.fuzzCase.name}): ${problem}`);
}

describe('the lint engine under 1,200 fuzzed files from a fixed seed', () => {
  it('runs every case, about evenly spread over the kinds', () => {
    expect(runs).toHaveLength(CASE_COUNT);
    for (const kind of FUZZ_KINDS) {
      expect(runs.filter((run) => run.fuzzCase.kind === kind).length).toBe(CASE_COUNT / FUZZ_KINDS.length);
    }
  });

  it('never throws: each file ends in one asset-unreadable finding with a known code, or normal findings', () => {
    const failures = runs.flatMap((run) => {
      if (run.error) return [{ run, problem: `threw ${(run.error as Error)?.stack ?? String(run.error)}` }];
      const problems = outcomeProblems(run.report!);
      if (run.report!.path !== `fuzz/${run.fuzzCase.name}`) problems.push(`report path ${run.report!.path}`);
      // The server stores reports as JSON: a report that cannot be serialised is as bad as a throw.
      try {
        JSON.stringify(run.report);
      } catch (error) {
        problems.push(`report does not serialise: ${(error as Error).message}`);
      }
      return problems.map((problem) => ({ run, problem }));
    });
    expect(describeFailures(failures)).toEqual([]);
  });

  it('answers each file within 5 seconds', () => {
    const slow = runs.filter((run) => run.elapsedMs > PER_FILE_LIMIT_MS);
    expect(describeFailures(slow.map((run) => ({ run, problem: `${Math.round(run.elapsedMs)} ms` })))).toEqual([]);
  });

  it('never asks for a side file outside the asset folder', () => {
    const escapes = runs.flatMap((run) =>
      run.requested.filter((request) => !isInsideFolder(request)).map((request) => ({ run, problem: request }))
    );
    expect(describeFailures(escapes)).toEqual([]);
  });

  it('refuses every URI that can only point outside the folder with a URI code, before reading anything', () => {
    const hostile = runs.filter((run) => run.fuzzCase.hostileUri?.isOutside);
    expect(hostile.length).toBeGreaterThan(60);
    const failures = hostile.flatMap((run) => {
      const code = unreadableCodeOf(run.report!);
      const problems: string[] = [];
      if (code !== 'asset.uri-outside-folder' && code !== 'asset.uri-invalid') {
        problems.push(`URI ${JSON.stringify(run.fuzzCase.hostileUri!.uri)} gave ${code ?? 'a readable asset'}`);
      }
      if (run.requested.length > 0) problems.push(`read ${run.requested.join(', ')} before refusing`);
      return problems.map((problem) => ({ run, problem }));
    });
    expect(describeFailures(failures)).toEqual([]);
  });

  it('keeps memory bounded: at most 64 MiB more heap kept, at most 1 GiB above the starting resident set', () => {
    expect(heapAfter - heapBefore).toBeLessThan(RETAINED_HEAP_LIMIT_BYTES);
    expect(rssPeak - rssBefore).toBeLessThan(PEAK_RSS_GROWTH_LIMIT_BYTES);
  });

  it('finds both outcomes in the corpus, so the fuzzing reaches past the first checks', () => {
    const readable = runs.filter((run) => run.report && !run.report.unreadable);
    const codes = new Set(runs.map((run) => run.report && unreadableCodeOf(run.report)).filter(Boolean));
    expect(readable.length).toBeGreaterThan(50);
    // Codes every corpus of this size reaches (asset-read-error.ts lists them).
    for (const code of [
      'asset.empty',
      'asset.not-gltf',
      'asset.glb-invalid',
      'asset.json-invalid',
      'asset.structure-invalid',
      'asset.uri-outside-folder',
      'asset.uri-invalid',
      'asset.side-file-missing',
      'asset.buffer-too-short',
      'asset.too-large'
    ]) {
      expect(codes, code).toContain(code);
    }
    const byKind = FUZZ_KINDS.map((kind) => {
      const ofKind = runs.filter((run) => run.fuzzCase.kind === kind);
      return `${kind} ${Math.round(ofKind.reduce((sum, run) => sum + run.elapsedMs, 0))} ms`;
    });
    console.info(byKind.join(', '));
    console.info(
      `fuzz-engine: ${runs.length} files in ${Math.round(totalMs)} ms (slowest ${Math.round(
        Math.max(...runs.map((run) => run.elapsedMs))
      )} ms), ${readable.length} readable; heap kept +${((heapAfter - heapBefore) / MIB).toFixed(1)} MiB, ` +
        `peak RSS +${((rssPeak - rssBefore) / MIB).toFixed(1)} MiB`
    );
  });
});

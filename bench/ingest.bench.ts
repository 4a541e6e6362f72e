/**
 * Ingestion benchmark: how long CI waits for `orientry submit` of a real-sized build, against
 * linting the same files on the CI machine with `orientry check`.
 *
 * Generates 50 animated GLBs of about 2 MB each (about 100 MB, 20 rotation channels per asset,
 * LINEAR and CUBICSPLINE, with defects), builds the CLI and the app when needed, and then times,
 * as wall clock of the whole CLI process:
 * - `node cli/dist/orientry.js check <folder>`: the local lint;
 * - `node cli/dist/orientry.js submit <folder>`: upload, and the server's receive (each file
 *   hashed as it arrives), lint, baseline comparison and write, against one warm server (its own data
 *   folder and database); every round has new asset contents, so every submission is a first one
 *   with nothing to reuse;
 * - the same submission again: the server derives the same idempotency key from the same files
 *   and details, and answers with the stored build, nothing stored twice.
 * Target (issue text): submit ≤ 1.5 × check. `BENCH_RUNS=2 npm run bench -- ingest` times fewer
 * rounds (default 5), for a quick look while working on ingestion; `BENCH_PROFILE=<folder>` writes
 * V8 CPU profiles of the server (its lint threads too) and of every CLI run there.
 */
import { spawn, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import { cpus, loadavg } from 'node:os';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { writeIngestAssets, type IngestAssets } from './support/ingest-assets';
import { cpuProfileArgs } from './support/cpu-profile';
import { exitedChildrenCpuMs, processCpuMs } from './support/cpu-time';
import { startIngestServer, type IngestServer } from './support/ingest-server';
import { copyBuild } from './support/orientry-server';
import { formatMarkdownTable, formatMegabytes, formatTable, type BenchRow } from './support/measure';

const ROOT = process.cwd();
const ASSET_COUNT = 50;
const ASSET_BYTES = 2 * 2 ** 20;
const RUNS = Number(process.env.BENCH_RUNS ?? 5);
const TARGET_RATIO = 1.5;
const ASSETS_FOLDER = path.join(ROOT, 'bench-output', 'ingest-assets');
const CLI = path.join(ROOT, 'cli', 'dist', 'orientry.js');

/** Points of a submission seen on stderr (progress lines of cli/upload-progress.ts). */
type Mark = 'sending' | 'uploaded';
const MARK_LINES: Record<Mark, string> = {
  sending: 'orientry submit: sending ',
  uploaded: 'orientry submit: uploaded; waiting'
};

await main();

async function main(): Promise<void> {
  process.stderr.write('Building the CLI, and the app when it is stale...\n');
  run(process.execPath, [path.join(ROOT, 'cli', 'build.js')]);
  const { ensureBuild } = (await import(pathToFileURL(path.join(ROOT, 'scripts', 'ensure-build.js')).href)) as {
    ensureBuild: () => boolean;
  };
  ensureBuild();
  const buildDir = copyBuild(ROOT);

  const checkMs: number[] = [];
  const submitMs: number[] = [];
  const serverMs: number[] = [];
  const repeatMs: number[] = [];
  const startMs: number[] = [];
  const uploadMs: number[] = [];
  const afterUploadMs: number[] = [];
  const checkCpuMs: number[] = [];
  const submitCpuMs: number[] = [];
  const cliCpuMs: number[] = [];
  let assets: IngestAssets | null = null;
  const server = await startIngestServer(ROOT, buildDir);
  try {
    // Round 0 is untimed: it warms the file cache and the server's JIT and SQLite, as a server
    // that has taken builds before is warm. Each round has its own asset contents, so its
    // submission is a first one: no stored lint or blob to reuse.
    for (let round = 0; round <= RUNS; round++) {
      process.stderr.write(round === 0 ? 'Warm-up round' : `Round ${round} of ${RUNS}`);
      process.stderr.write(`: generating ${ASSET_COUNT} assets of about ${formatMegabytes(ASSET_BYTES)}...\n`);
      assets = await writeIngestAssets({
        folder: ASSETS_FOLDER,
        assetCount: ASSET_COUNT,
        targetByteLength: ASSET_BYTES,
        variant: round
      });
      const check = await timeCli(['check', ASSETS_FOLDER], {});
      const args = submitArgs(server, `bench-${process.pid}-${round}`);
      const serverCpuBefore = processCpuMs(server.pid);
      const submit = await timeCli(args, { ORIENTRY_TOKEN: server.secret });
      const serverCpu = (processCpuMs(server.pid) ?? Number.NaN) - (serverCpuBefore ?? Number.NaN);
      const repeat = await timeCli(args, { ORIENTRY_TOKEN: server.secret });
      if (!repeat.stdout.includes('already submitted')) {
        throw new Error(`The repeated submission was not answered as already stored:\n${repeat.stdout}`);
      }
      if (round === 0) continue;
      checkMs.push(check.ms);
      checkCpuMs.push(check.cpuMs);
      submitMs.push(submit.ms);
      cliCpuMs.push(submit.cpuMs);
      submitCpuMs.push(submit.cpuMs + serverCpu);
      repeatMs.push(repeat.ms);
      serverMs.push((await server.latestBuildDurationMs()) ?? Number.NaN);
      const { sending = Number.NaN, uploaded = Number.NaN } = submit.marks;
      startMs.push(sending);
      uploadMs.push(uploaded - sending);
      afterUploadMs.push(submit.ms - uploaded);
    }
  } finally {
    await server.remove();
    fs.rmSync(buildDir, { recursive: true, force: true });
  }
  if (!assets) throw new Error('No round ran.');

  const check = median(checkMs);
  const submit = median(submitMs);
  const ratio = submit / check;
  const megabytes = assets.byteLength / 2 ** 20;
  const rows: BenchRow[] = [
    {
      measure: 'Build',
      value: `${ASSET_COUNT} GLB, ${formatMegabytes(assets.byteLength)}, ${assets.rotationKeys.toLocaleString('en-US')} rotation keys`
    },
    { measure: '`orientry check` (local lint)', value: `${formatSeconds(check)} (${rate(megabytes, check)})` },
    {
      measure: '`orientry submit` (first upload of these files)',
      value: `${formatSeconds(submit)} (${rate(megabytes, submit)})`
    },
    { measure: '  CLI start and collect files', value: formatSeconds(median(startMs)) },
    { measure: '  upload (first to last byte sent)', value: formatSeconds(median(uploadMs)) },
    { measure: '  after the last byte (lint, compare, store, answer)', value: formatSeconds(median(afterUploadMs)) },
    { measure: "  server's own time before the write (durationMs)", value: formatSeconds(median(serverMs)) },
    { measure: '`orientry submit` again (same key: the stored build)', value: formatSeconds(median(repeatMs)) },
    {
      measure: 'CPU time: check / submit (CLI + server)',
      value:
        `${formatSeconds(median(checkCpuMs))} / ${formatSeconds(median(submitCpuMs))} ` +
        `(${formatSeconds(median(cliCpuMs))} + ${formatSeconds(median(submitCpuMs) - median(cliCpuMs))})`
    },
    {
      measure: 'submit / check',
      value: `${ratio.toFixed(2)}×`,
      target: `≤ ${TARGET_RATIO}×`,
      isMet: ratio <= TARGET_RATIO
    }
  ];
  const machine = `Node ${process.version}, ${cpus().length} × ${cpus()[0]?.model ?? 'CPU'}, load average ${loadavg()[0].toFixed(1)}`;
  const title = `Orientry ingestion: median of ${RUNS} rounds, wall clock of the CLI process (${machine})`;
  process.stdout.write(`${formatTable(title, rows)}\n\n`);
  process.stdout.write(
    `All runs (ms): check ${checkMs.map(Math.round).join(', ')}; submit ${submitMs.map(Math.round).join(', ')}; ` +
      `server ${serverMs.join(', ')}; CPU check ${checkCpuMs.join(', ')}; CPU submit ${submitCpuMs.join(', ')}\n\n`
  );
  process.stdout.write(`Markdown for README:\n\n${formatMarkdownTable(rows)}\n`);
}

function submitArgs(server: IngestServer, key: string): string[] {
  return [
    'submit',
    ASSETS_FOLDER,
    '--root',
    ASSETS_FOLDER,
    '--server',
    server.url,
    '--project',
    server.project,
    '--commit',
    '7e1de0b5',
    '--branch',
    'main',
    // A unique label gives a unique derived idempotency key, as a CI run number does.
    '--label',
    key,
    '--retries',
    '0'
  ];
}

/**
 * Runs the bundled CLI and times the whole process, noting when its progress lines appear; exit
 * 0 or 1 (a gate verdict) is success.
 */
async function timeCli(
  args: string[],
  env: Record<string, string>
): Promise<{ ms: number; cpuMs: number; stdout: string; stderr: string; marks: Partial<Record<Mark, number>> }> {
  const cpuBefore = exitedChildrenCpuMs();
  const startedAt = process.hrtime.bigint();
  const child = spawn(process.execPath, [...cpuProfileArgs('cli'), CLI, ...args], {
    cwd: ROOT,
    env: { ...process.env, NO_COLOR: '1', ...env },
    stdio: ['ignore', 'pipe', 'pipe']
  });
  let stdout = '';
  let stderr = '';
  const marks: Partial<Record<Mark, number>> = {};
  child.stdout.setEncoding('utf8').on('data', (text: string) => (stdout += text));
  child.stderr.setEncoding('utf8').on('data', (text: string) => {
    stderr += text;
    const atMs = Number(process.hrtime.bigint() - startedAt) / 1e6;
    for (const [mark, line] of Object.entries(MARK_LINES) as [Mark, string][]) {
      if (marks[mark] === undefined && stderr.includes(line)) marks[mark] = atMs;
    }
  });
  const status = await new Promise<number | null>((resolve, reject) => {
    child.once('error', reject);
    child.once('close', resolve);
  });
  const ms = Number(process.hrtime.bigint() - startedAt) / 1e6;
  const cpuMs = (exitedChildrenCpuMs() ?? Number.NaN) - (cpuBefore ?? Number.NaN);
  if (status !== 0 && status !== 1) {
    throw new Error(`orientry ${args[0]} exited ${status}:\n${stderr}`);
  }
  return { ms, cpuMs, stdout, stderr, marks };
}

function run(command: string, args: string[]): void {
  const result = spawnSync(command, args, { cwd: ROOT, stdio: ['ignore', 'inherit', 'inherit'] });
  if (result.status !== 0) throw new Error(`${command} ${args.join(' ')} failed (exit ${result.status}).`);
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)];
}

function formatSeconds(ms: number): string {
  return `${(ms / 1000).toFixed(2)} s`;
}

function rate(megabytes: number, ms: number): string {
  return `${(megabytes / (ms / 1000)).toFixed(0)} MB/s`;
}

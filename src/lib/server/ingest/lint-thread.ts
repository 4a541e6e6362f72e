/**
 * Runs upload lints on worker threads beside the server's main thread, so a build's assets are
 * linted on the other cores while the main thread goes on receiving the rest of the upload (and
 * answering every other request) instead of stalling between chunks.
 *
 * Design notes: up to `ORIENTRY_LINT_THREADS` threads per server process (default: one per core,
 * at most 4), each started when a job finds every running thread busy and kept (unref'd, so none
 * holds the process open). A job goes to the thread with the fewest jobs waiting. The threads run
 * build/lint-worker.mjs, an esbuild bundle of lint-worker.ts made by `npm run build` next to the
 * app; where that file is not found (vite dev, vitest running the sources) or with
 * `ORIENTRY_LINT_THREADS=0`, jobs run on the calling thread, with the same code and the same
 * results. A thread that dies fails the jobs it held (the upload answers 500, nothing is stored)
 * and later jobs start a new one. Measured with bench/ingest.bench.ts: see README's tables.
 */
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import { getConfig } from '../config';
import { lintFileOnDisk, type DiskLintJob, type DiskLintResult } from './lint-file-on-disk';
import type { LintThreadAnswer } from './lint-thread-messages';

/** File name of the bundled thread entry, in the app's build folder. */
export const LINT_WORKER_FILE = 'lint-worker.mjs';

interface PendingJob {
  resolve: (result: DiskLintResult) => void;
  reject: (error: Error) => void;
}

/** A running thread and the jobs it has not answered yet. */
interface LintThread {
  worker: Worker;
  pending: Map<number, PendingJob>;
}

let threads: LintThread[] = [];
let nextJobId = 1;
let scriptPath: string | null | undefined;

/** Lints `job` on a lint thread when there are any, else here. Rejects only for bugs or a dead thread. */
export function lintOffMainThread(job: DiskLintJob): Promise<DiskLintResult> {
  const limit = lintThreadCount();
  if (limit === 0) return lintFileOnDisk(job);
  const { worker, pending } = pickThread(limit);
  const id = nextJobId++;
  return new Promise<DiskLintResult>((resolve, reject) => {
    pending.set(id, { resolve, reject });
    worker.postMessage({ id, job });
  });
}

/** How many lint threads this process may run; 0 when lints run on the calling thread. */
export function lintThreadCount(): number {
  const configured = getConfig().lintThreads;
  if (configured === 0) return 0;
  scriptPath ??= findWorkerScript();
  return scriptPath === null ? 0 : configured;
}

/**
 * Makes lint threads run `script` (a built lint-worker.mjs, or any module that answers as it
 * does) from the next job on; null goes back to finding the bundled one. For tests.
 */
export function useLintWorkerScript(script: string | null): void {
  scriptPath = script ?? undefined;
  for (const thread of threads) void thread.worker.terminate();
  threads = [];
}

/** An idle thread, a new one while fewer than `limit` run, else the one with the fewest jobs waiting. */
function pickThread(limit: number): LintThread {
  let least: LintThread | null = null;
  for (const thread of threads) if (!least || thread.pending.size < least.pending.size) least = thread;
  if (least && (least.pending.size === 0 || threads.length >= limit)) return least;
  return startThread();
}

function startThread(): LintThread {
  const worker = new Worker(scriptPath!);
  const started: LintThread = { worker, pending: new Map() };
  const { pending } = started;
  worker.on('message', (answer: LintThreadAnswer) => {
    const job = pending.get(answer.id);
    if (!job) return;
    pending.delete(answer.id);
    if ('result' in answer) job.resolve(answer.result);
    else job.reject(Object.assign(new Error(`lint thread: ${answer.error.message}`), { stack: answer.error.stack }));
  });
  const failAll = (reason: Error) => {
    threads = threads.filter((thread) => thread !== started);
    for (const job of pending.values()) job.reject(reason);
    pending.clear();
  };
  worker.on('error', (error) => failAll(new Error(`lint thread failed: ${error.message}`, { cause: error })));
  worker.on('exit', (code) => failAll(new Error(`lint thread stopped (exit code ${code}) before answering`)));
  // Last: adding a 'message' listener refs the thread again, and an unref'd one never holds the process open.
  worker.unref();
  threads.push(started);
  return started;
}

/**
 * The bundled entry beside the app: searched from this module's folder upwards, since the
 * bundler puts this module in a chunk a folder or two below the build folder.
 */
function findWorkerScript(): string | null {
  let folder = path.dirname(fileURLToPath(import.meta.url));
  for (let level = 0; level < 4; level++) {
    const candidate = path.join(folder, LINT_WORKER_FILE);
    if (fs.existsSync(candidate)) return candidate;
    folder = path.dirname(folder);
  }
  return null;
}

/**
 * Runs upload lints on one worker thread beside the server's main thread, so a build's assets
 * are linted on the second core while the main thread goes on receiving the rest of the upload
 * (and answering every other request) instead of stalling between chunks.
 *
 * Design notes: one thread per server process, started on the first job and kept (unref'd, so it
 * never holds the process open). Jobs queue on it in the order they are given; a build's linter
 * gives them one at a time anyway. The thread runs build/lint-worker.mjs, an esbuild bundle of
 * lint-worker.ts made by `npm run build` next to the app; where that file is not found (vite dev,
 * vitest running the sources) or `ORIENTRY_LINT_THREAD=main`, jobs run on the calling thread, with
 * the same code and the same results. A thread that dies fails the jobs it held (the upload
 * answers 500, nothing is stored) and the next job starts a new one.
 * Measured with bench/ingest.bench.ts (50 GLBs, 100 MB, 2-core machine): see README's tables.
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

/** Where lints run: on the lint thread, or on the caller's thread. */
export type LintThreadMode = 'worker' | 'main';

interface PendingJob {
  resolve: (result: DiskLintResult) => void;
  reject: (error: Error) => void;
}

/** The running thread and the jobs it has not answered yet. */
interface LintThread {
  worker: Worker;
  pending: Map<number, PendingJob>;
}

let thread: LintThread | null = null;
let nextJobId = 1;
let scriptPath: string | null | undefined;

/** Lints `job` on the lint thread when there is one, else here. Rejects only for bugs or a dead thread. */
export function lintOffMainThread(job: DiskLintJob): Promise<DiskLintResult> {
  if (lintThreadMode() === 'main') return lintFileOnDisk(job);
  const { worker, pending } = thread ?? startThread();
  const id = nextJobId++;
  return new Promise<DiskLintResult>((resolve, reject) => {
    pending.set(id, { resolve, reject });
    worker.postMessage({ id, job });
  });
}

/**
 * Makes the lint thread run `script` (a built lint-worker.mjs, or any module that answers as it
 * does) from the next job on; null goes back to finding the bundled one. For tests.
 */
export function useLintWorkerScript(script: string | null): void {
  scriptPath = script ?? undefined;
  void thread?.worker.terminate();
  thread = null;
}

/** Where this process lints uploads (reported by the health route). */
export function lintThreadMode(): LintThreadMode {
  if (getConfig().lintThread === 'main') return 'main';
  scriptPath ??= findWorkerScript();
  return scriptPath === null ? 'main' : 'worker';
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
    if (thread === started) thread = null;
    for (const job of pending.values()) job.reject(reason);
    pending.clear();
  };
  worker.on('error', (error) => failAll(new Error(`lint thread failed: ${error.message}`, { cause: error })));
  worker.on('exit', (code) => failAll(new Error(`lint thread stopped (exit code ${code}) before answering`)));
  // Last: adding a 'message' listener refs the thread again, and an unref'd one never holds the process open.
  worker.unref();
  thread = started;
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

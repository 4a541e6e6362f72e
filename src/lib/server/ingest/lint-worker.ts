/**
 * A lint thread's entry (bundled to build/lint-worker.mjs by scripts/build-lint-worker.js):
 * takes {@link DiskLintJob}s from the server's main thread and answers each with its result or
 * the error that stopped it. Jobs are independent; each answer carries its job's id.
 */
import { parentPort } from 'node:worker_threads';
import { lintFileOnDisk, type DiskLintJob } from './lint-file-on-disk';
import type { LintThreadAnswer } from './lint-thread-messages';

const port = parentPort;
if (!port) throw new Error('lint-worker: start this module as a worker thread, not on its own.');

port.on('message', async ({ id, job }: { id: number; job: DiskLintJob }) => {
  let answer: LintThreadAnswer;
  try {
    answer = { id, result: await lintFileOnDisk(job) };
  } catch (error) {
    const { message, stack } = error instanceof Error ? error : new Error(String(error));
    answer = { id, error: { message, stack } };
  }
  port.postMessage(answer);
});

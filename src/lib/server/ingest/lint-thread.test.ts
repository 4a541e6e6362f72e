import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, afterEach, describe, expect, it } from 'vitest';
import { parsePolicy } from '../../lint/policy';
import { resetConfig } from '../config';
import { lintOffMainThread, lintThreadCount, useLintWorkerScript } from './lint-thread';
import type { DiskLintJob } from './lint-file-on-disk';

const folder = fs.mkdtempSync(path.join(os.tmpdir(), 'orientry-lint-thread-'));
afterAll(() => fs.rmSync(folder, { recursive: true, force: true }));
afterEach(() => {
  useLintWorkerScript(null);
  delete process.env.ORIENTRY_LINT_THREADS;
  resetConfig();
});

/** A stand-in thread entry: `body` runs for each job message `{ id, job }`. */
function fakeWorker(name: string, body: string): string {
  const file = path.join(folder, `${name}.mjs`);
  fs.writeFileSync(
    file,
    `import { parentPort } from 'node:worker_threads';\nparentPort.on('message', ({ id, job }) => { ${body} });\n`
  );
  return file;
}

const job: DiskLintJob = {
  assetPath: 'chars/kelp.glb',
  diskPath: path.join(folder, 'kelp.glb'),
  filesFolder: folder,
  digests: new Map([['chars/kelp.glb', 'ab']]),
  policy: parsePolicy({})
};

describe('lintOffMainThread', () => {
  it('runs on the calling thread when there is no bundled thread entry (the sources, as here)', async () => {
    expect(lintThreadCount()).toBe(0);
    fs.writeFileSync(job.diskPath, 'not a glb');
    const { report } = await lintOffMainThread(job);
    expect(report.unreadable).toBe(true);
    expect(report.findings.map((finding) => finding.rule)).toEqual(['asset-unreadable']);
  });

  it('hands the job to the thread, clone and all, and gives back its answer', async () => {
    useLintWorkerScript(
      fakeWorker(
        'echo',
        'parentPort.postMessage({ id, result: { report: { path: job.assetPath, digest: job.digests.get(job.assetPath) }, sideFiles: {} } });'
      )
    );
    expect(lintThreadCount()).toBe(Math.min(4, os.availableParallelism()));
    const answers = await Promise.all([lintOffMainThread(job), lintOffMainThread({ ...job, assetPath: 'b.glb' })]);
    expect(answers.map((answer) => answer.report)).toEqual([
      { path: 'chars/kelp.glb', digest: 'ab' },
      { path: 'b.glb', digest: undefined }
    ]);
  });

  it("rejects with the thread's error for a job that failed there", async () => {
    useLintWorkerScript(fakeWorker('fails', "parentPort.postMessage({ id, error: { message: 'rule blew up' } });"));
    await expect(lintOffMainThread(job)).rejects.toThrow('lint thread: rule blew up');
  });

  it('fails the jobs a dying thread held, and the next job starts a new thread', async () => {
    const marker = path.join(folder, 'died-once');
    useLintWorkerScript(
      fakeWorker(
        'dies-once',
        `import('node:fs').then((fs) => { if (!fs.existsSync(${JSON.stringify(marker)})) { fs.writeFileSync(${JSON.stringify(marker)}, ''); process.exit(3); } parentPort.postMessage({ id, result: { report: 'second thread', sideFiles: {} } }); });`
      )
    );
    await expect(lintOffMainThread(job)).rejects.toThrow('lint thread stopped (exit code 3)');
    await expect(lintOffMainThread(job)).resolves.toEqual({ report: 'second thread', sideFiles: {} });
  });

  it('spreads jobs given at once over up to ORIENTRY_LINT_THREADS threads', async () => {
    process.env.ORIENTRY_LINT_THREADS = '2';
    resetConfig();
    // Each answer names its thread; a thread holds its job 50 ms, so the second job finds the first busy.
    useLintWorkerScript(
      fakeWorker(
        'names-thread',
        "import('node:worker_threads').then(({ threadId }) => setTimeout(() => parentPort.postMessage({ id, result: { report: threadId, sideFiles: {} } }), 50));"
      )
    );
    const answers = await Promise.all([1, 2, 3, 4].map(() => lintOffMainThread(job)));
    const threadIds = answers.map((answer) => answer.report as unknown as number);
    expect(new Set(threadIds).size).toBe(2);
    // Two at a time: the third and fourth jobs go to the threads the first two used.
    expect(threadIds.slice(2).sort()).toEqual(threadIds.slice(0, 2).sort());
  });

  it('runs on the calling thread with ORIENTRY_LINT_THREADS=0, even where a thread entry exists', async () => {
    process.env.ORIENTRY_LINT_THREADS = '0';
    resetConfig();
    useLintWorkerScript(fakeWorker('never', "parentPort.postMessage({ id, error: { message: 'not here' } });"));
    expect(lintThreadCount()).toBe(0);
    fs.writeFileSync(job.diskPath, 'not a glb');
    expect((await lintOffMainThread(job)).report.unreadable).toBe(true);
  });
});

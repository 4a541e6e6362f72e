/**
 * This process's SQLite writes from ingestion, one at a time, queued in JavaScript.
 *
 * Design notes: SQLite has one writer. A connection that meets the write lock waits in its busy
 * handler (busy_timeout, 5 s), which sleeps inside one of libuv's four threadpool threads, and
 * every other query on that connection blocks a thread behind it. Twenty CLI builds of ten assets
 * stored at once filled the pool with waiters, so the transaction holding the lock could not run
 * its next statement (nor could any file be read): uploads stalled for whole busy timeouts and
 * some answered 500 with SQLITE_BUSY (tests/integration/load-concurrent-submits.test.ts: about
 * 75 s with several 500s the CLI had to retry; with this queue about 14 s and none). Waiting here holds no thread. PostgreSQL takes
 * concurrent writers itself, so there the work runs at once.
 */
import type { Sequelize } from 'sequelize';

let tail: Promise<unknown> = Promise.resolve();

/**
 * Runs `work` (one transaction or one statement on `sequelize`) after every write queued before it
 * has settled, on SQLite; at once on PostgreSQL. Resolves or rejects as `work` does.
 */
export function queueSqliteWrite<T>(sequelize: Sequelize, work: () => Promise<T>): Promise<T> {
  if (sequelize.getDialect() !== 'sqlite') return work();
  const run = tail.then(work, work);
  // The queue only needs to know when `run` settles; its outcome goes to the caller through `run`.
  tail = run.then(
    () => undefined,
    () => undefined
  );
  return run;
}

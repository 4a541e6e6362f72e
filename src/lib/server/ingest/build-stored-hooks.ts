/**
 * Work that must commit or roll back together with a new build, such as queueing the mails a
 * failed build sends. A hook runs inside the build's write transaction, after every row of the
 * build is written; if it throws, the whole build is rolled back and the upload answers 500.
 * Register hooks once at start-up; keep them short (the SQLite write lock is held meanwhile).
 */
import type { Transaction } from 'sequelize';
import type { Build, Project } from '../db/models';
import type { BuildPlan } from './plan-build';

/** What a hook learns about the stored build. */
export interface StoredBuildContext {
  project: Project;
  build: Build;
  plan: BuildPlan;
  /** Pass to every query of the hook so its rows commit with the build. */
  transaction: Transaction;
  /** Absolute URL of the build's report page. */
  reportUrl: string;
}

/** A function run inside the build's write transaction. */
export type BuildStoredHook = (context: StoredBuildContext) => Promise<void>;

const hooks: BuildStoredHook[] = [];

/** Registers a hook for every build stored from now on; returns a function that removes it. */
export function onBuildStored(hook: BuildStoredHook): () => void {
  hooks.push(hook);
  return () => {
    const index = hooks.indexOf(hook);
    if (index >= 0) hooks.splice(index, 1);
  };
}

/** Runs the registered hooks in registration order (ingestion calls this in its transaction). */
export async function runBuildStoredHooks(context: StoredBuildContext): Promise<void> {
  for (const hook of hooks) await hook(context);
}

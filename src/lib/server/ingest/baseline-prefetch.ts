/**
 * The baseline of a build being uploaded, with its standing findings read while the files still
 * stream in rather than after the last byte. The read is checked, not trusted: the baseline is
 * looked up again for the build's own time once the upload is complete, and only when it is the
 * same build are the early findings used (a build stored on the base branch meanwhile, or a
 * `builtAt` in the past, makes another baseline, whose findings are then read).
 *
 * Design notes: with the 50 assets and 5,650 findings of bench/ingest.bench.ts, reading the
 * baseline's findings took about 50 ms of the time between the last byte and the answer. Only
 * what the comparison needs is read (find-standing-findings.ts); the fixed ones are read whole
 * later, by id.
 */
import type { Build } from '../db/models';
import { findBaselineBuild } from '../builds/find-baseline-build';
import { findStandingEntries, type StandingEntry } from '../builds/find-standing-findings';

/** A build's baseline and its standing findings (null without a baseline). */
export interface Baseline {
  build: Build | null;
  findings: StandingEntry[] | null;
}

/** The baseline as of now, read in the background; {@link Baseline} for the build's own time on request. */
export interface BaselinePrefetch {
  baselineAt(builtAt: Date): Promise<Baseline>;
}

/** Starts reading the project's current baseline; the read never rejects (a failed one is read again). */
export function prefetchBaseline(project: { id: number; baseBranch: string }): BaselinePrefetch {
  const early = readBaseline(project, new Date()).catch(() => null);
  return {
    async baselineAt(builtAt) {
      const build = await findBaselineBuild(project, builtAt);
      if (!build) return { build: null, findings: null };
      const prefetched = await early;
      if (prefetched?.build?.id === build.id) return { build, findings: prefetched.findings };
      return { build, findings: await findStandingEntries(build.id) };
    }
  };
}

async function readBaseline(project: { id: number; baseBranch: string }, before: Date): Promise<Baseline> {
  const build = await findBaselineBuild(project, before);
  return { build, findings: build ? await findStandingEntries(build.id) : null };
}

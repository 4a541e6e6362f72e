/**
 * Linting an upload while it arrives: each asset is linted (or its stored lint reused) as soon
 * as its file is wholly received, as many at once as there are lint threads, while the next files
 * are still streaming in.
 * When the upload ends only the assets not done yet are linted, so the client waits for little
 * more than the last file's lint after its last byte.
 *
 * Design notes: a result obtained early is kept only when everything it depends on had arrived.
 * An asset may name side files (a `.gltf` and its `.bin`) that come later in the body; the
 * reader then finds them missing; such a result (one that asked for a side file it could not
 * read) is provisional and the asset is linted again once the whole upload is in, with every
 * file known. A lone `.glb`, the common case, is final at once. Measured with the 50 GLBs of
 * 2 MB of bench/ingest.bench.ts sent by the CLI: the lints left when the last byte arrived took
 * about 10 ms, against about 1 s for the 50 lints that all ran after the upload before. The lints
 * themselves run on the lint threads (lint-thread.ts), so receiving never waits for them.
 */
import { isAssetIncluded } from '../../lint/asset-filter';
import type { Policy } from '../../lint/policy';
import pLimit from 'p-limit';
import { isAssetFile, lintReceivedAsset, readAllSideFiles, skippedAsset, type LintedAsset } from './lint-upload';
import { lintThreadCount } from './lint-thread';
import type { ReceivedFile } from './receive-upload';

/** The linter of one upload. */
export interface UploadLinter {
  /** Takes a wholly received file (pass as receiveUpload's `onFileReceived`); never throws. */
  received(file: ReceivedFile): void;
  /**
   * Waits for the lints under way and returns every asset of the upload in path order, linting
   * now those not done or done before a side file they named had arrived.
   * @throws the first unexpected failure of a lint (a bug or a database error).
   */
  finish(files: readonly ReceivedFile[]): Promise<LintedAsset[]>;
  /** Stops taking work and waits for the lints under way, for an upload that failed. Never throws. */
  settle(): Promise<void>;
}

/**
 * Makes the linter for an upload received into `filesFolder`, under `policy`.
 * @param onLinted called with each asset linted while the upload arrives, to prepare its rows.
 */
export function createUploadLinter(
  filesFolder: string,
  policy: Policy,
  policyVersion: string,
  onLinted: (asset: LintedAsset) => void = () => {}
): UploadLinter {
  const digests = new Map<string, string>();
  const finals = new Map<string, LintedAsset>();
  // As many lints at once as there are lint threads; one at a time when they run on this thread.
  const limit = pLimit(Math.max(1, lintThreadCount()));
  const early: Promise<void>[] = [];
  let failure: { error: unknown } | null = null;
  let isStopped = false;

  const lintEarly = async (file: ReceivedFile) => {
    if (isStopped || failure) return;
    const linted = await lintReceivedAsset(file, filesFolder, policy, policyVersion, digests);
    if (!readAllSideFiles(linted)) return;
    finals.set(file.path, linted);
    onLinted(linted);
  };

  return {
    received(file) {
      digests.set(file.path, file.sha256);
      if (!isAssetFile(file.path) || !isAssetIncluded(file.path, policy)) return;
      // Started in arrival order; a failure is kept for finish() to throw.
      early.push(
        limit(() => lintEarly(file)).catch((error: unknown) => {
          failure ??= { error };
        })
      );
    },

    async finish(files) {
      await Promise.all(early);
      if (failure) throw failure.error;
      for (const file of files) digests.set(file.path, file.sha256);
      const assets = files.filter((file) => isAssetFile(file.path)).sort((a, b) => compareText(a.path, b.path));
      return Promise.all(
        assets.map(async (file) => {
          if (!isAssetIncluded(file.path, policy)) return skippedAsset(file);
          return (
            finals.get(file.path) ?? limit(() => lintReceivedAsset(file, filesFolder, policy, policyVersion, digests))
          );
        })
      );
    },

    async settle() {
      isStopped = true;
      await Promise.all(early);
    }
  };
}

/** Code-unit order, the same on every machine (no locale). */
function compareText(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

/**
 * Lints dropped files in the browser with the same library the CLI and the server use: each
 * `.glb`/`.gltf` becomes an AssetSource whose side files are read from the drop, and the results
 * become one LintReport. Nothing leaves the browser. The library is loaded on first use, so the
 * page itself stays light.
 */
import type { LintReport, Policy } from '$lib/lint';
import type { DroppedFile } from './dropped-files';
import { findSidePath, isAssetPath } from './side-file-lookup';

/** A finished check. */
export interface DroppedFilesCheck {
  report: LintReport;
  /** Dropped side files no asset asked for (a misplaced texture, a stray file). */
  unusedPaths: string[];
  durationMs: number;
}

/**
 * Lints every asset among `files` under `policy`, one after the other, reporting progress.
 * A file that cannot be read becomes an `asset-unreadable` finding, as in CI.
 */
export async function lintDroppedFiles(
  files: readonly DroppedFile[],
  policy: Policy,
  onProgress: (done: number, total: number, path: string) => void
): Promise<DroppedFilesCheck> {
  const startedAt = performance.now();
  const lint = await import('$lib/lint');
  const byPath = new Map(files.map((dropped) => [dropped.path, dropped]));
  const paths = new Set(byPath.keys());
  const used = new Set<string>();
  const assets = files.filter((dropped) => isAssetPath(dropped.path)).sort((a, b) => a.path.localeCompare(b.path));

  const reports = [];
  for (const [index, asset] of assets.entries()) {
    onProgress(index, assets.length, asset.path);
    // Let the page paint the progress before a long synchronous lint.
    await new Promise((resolve) => setTimeout(resolve, 0));
    const bytes = new Uint8Array(await asset.file.arrayBuffer());
    reports.push(
      await lint.lintAsset(
        {
          path: asset.path,
          bytes,
          async readSideFile(relativePath) {
            const found = findSidePath(asset.path, relativePath, paths);
            if (found === null) return null;
            used.add(found);
            return new Uint8Array(await byPath.get(found)!.file.arrayBuffer());
          }
        },
        policy
      )
    );
  }
  onProgress(assets.length, assets.length, '');
  return {
    report: lint.buildLintReport(reports, policy),
    unusedPaths: [...paths].filter((path) => !isAssetPath(path) && !used.has(path)).sort(),
    durationMs: performance.now() - startedAt
  };
}

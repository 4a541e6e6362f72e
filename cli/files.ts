/**
 * Turns the command line's files, folders and globs into asset sources for the lint library.
 * Side files (buffers, images) are read only from inside the main file's folder: a URI that
 * resolves outside it, directly or through a symlink, is refused and never opened.
 */
import { readFile, realpath, stat } from 'node:fs/promises';
import { dirname, isAbsolute, relative, resolve, sep } from 'node:path';
import { glob, isDynamicPattern } from 'tinyglobby';
import type { AssetSource } from '$lib/lint';
import { AssetReadError } from '$lib/lint/asset-read-error';
import { CliError } from './cli-error';
import { ExitCode } from './exit-codes';
import { isInside } from './is-inside';
import { isMissing } from './is-missing';

/** One main file to lint: where it is on disk and how reports name it. */
export interface InputFile {
  absolutePath: string;
  /** Relative to the working directory with forward slashes (absolute when outside it). */
  displayPath: string;
}

/** What the command line matched: files in display order, and the globs that matched nothing. */
export interface ExpandedInputs {
  files: InputFile[];
  unmatchedPatterns: string[];
}

/** What a folder argument expands to (case-insensitive, so `HERO.GLB` counts). */
export const ASSET_GLOB = '**/*.{glb,gltf}';
const ASSET_EXTENSION = /\.(glb|gltf)$/i;
/** Package folders hold other people's sample assets, never the build being checked. */
const IGNORED = ['**/node_modules/**'];

/**
 * Expands arguments into main files: a folder gives every .glb/.gltf below it, an existing file
 * is taken as named (whatever its extension), anything else is a glob filtered to .glb/.gltf.
 * @throws CliError `input.not-found` for a plain path that does not exist, `input.no-match`
 *   when nothing at all matched (both exit code 2).
 */
export async function expandInputs(patterns: readonly string[], cwd: string): Promise<ExpandedInputs> {
  const byPath = new Map<string, InputFile>();
  const unmatchedPatterns: string[] = [];
  for (const pattern of patterns) {
    const matches = await expandOne(pattern, cwd);
    if (matches.length === 0) unmatchedPatterns.push(pattern);
    for (const absolutePath of matches) {
      byPath.set(absolutePath, { absolutePath, displayPath: toDisplayPath(absolutePath, cwd) });
    }
  }
  const files = [...byPath.values()].sort((a, b) => (a.displayPath < b.displayPath ? -1 : 1));
  if (files.length === 0) {
    throw new CliError(
      'input.no-match',
      `no .glb or .gltf file matched ${patterns.map((p) => `"${p}"`).join(', ')} (from ${cwd})`,
      ExitCode.UsageError
    );
  }
  return { files, unmatchedPatterns };
}

async function expandOne(pattern: string, cwd: string): Promise<string[]> {
  const absolutePath = resolve(cwd, pattern);
  const kind = await getEntryKind(absolutePath);
  if (kind === 'directory') {
    return glob(ASSET_GLOB, { cwd: absolutePath, absolute: true, caseSensitiveMatch: false, ignore: IGNORED });
  }
  if (kind === 'file') return [absolutePath];
  if (!isDynamicPattern(pattern)) {
    throw new CliError(
      'input.not-found',
      `${pattern}: no such file or folder (from ${cwd}); check the path, or quote a glob so the shell does not expand it`,
      ExitCode.UsageError
    );
  }
  const matches = await glob(pattern, { cwd, absolute: true, ignore: IGNORED, expandDirectories: false });
  return matches.filter((path) => ASSET_EXTENSION.test(path)).map((path) => resolve(path));
}

/**
 * `missing` only for a path that does not exist; anything else stat cannot answer (no
 * permission) counts as a file, so reading it fails and is reported as unreadable.
 */
async function getEntryKind(absolutePath: string): Promise<'file' | 'directory' | 'missing'> {
  try {
    return (await stat(absolutePath)).isDirectory() ? 'directory' : 'file';
  } catch (error) {
    if (isMissing(error)) return 'missing';
    return 'file';
  }
}

function toDisplayPath(absolutePath: string, cwd: string): string {
  const fromCwd = relative(cwd, absolutePath);
  const path = isInside(cwd, absolutePath) ? fromCwd : absolutePath;
  return path.split(sep).join('/');
}

/**
 * Reads a main file and returns the lint library's view of it. The source's `readSideFile`
 * only reads inside the main file's folder (see {@link createSideFileReader}).
 * @throws the file system's error when the main file cannot be read.
 */
export async function readAssetSource(file: InputFile, options: SideFileOptions = {}): Promise<AssetSource> {
  const bytes = new Uint8Array(await readFile(file.absolutePath));
  return { path: file.displayPath, bytes, readSideFile: createSideFileReader(dirname(file.absolutePath), options) };
}

/** Hooks for side file reads. */
export interface SideFileOptions {
  /** Called with the real path of every side file read (fix uses it to never write over one). */
  onSideFileRead?: (realPath: string) => void;
}

/**
 * A side file reader confined to `folder`: the relative path is resolved against the folder, and
 * both the resolved path and its real path (symlinks followed) must stay inside the folder's real
 * path before anything is opened. Resolves null for a file that does not exist.
 * @throws AssetReadError `asset.uri-outside-folder` for a path that leaves the folder.
 */
export function createSideFileReader(
  folder: string,
  options: SideFileOptions = {}
): (relativePath: string) => Promise<Uint8Array | null> {
  let realFolder: Promise<string> | null = null;
  return async (relativePath) => {
    const candidate = resolve(folder, relativePath);
    if (isAbsolute(relativePath) || !isInside(folder, candidate)) throw refused(relativePath);
    let realCandidate: string;
    try {
      realCandidate = await realpath(candidate);
    } catch (error) {
      if (isMissing(error)) return null;
      throw error;
    }
    realFolder ??= realpath(folder);
    if (!isInside(await realFolder, realCandidate)) throw refused(relativePath);
    // Only regular files: a FIFO or device below the folder would block or stream forever.
    if (!(await stat(realCandidate)).isFile()) return null;
    const bytes = new Uint8Array(await readFile(realCandidate));
    options.onSideFileRead?.(realCandidate);
    return bytes;
  };
}

function refused(relativePath: string): AssetReadError {
  return new AssetReadError(
    'asset.uri-outside-folder',
    `side file "${relativePath}" resolves outside the asset's folder; it was not read.`,
    'Keep buffers and images in the folder of the .gltf file (or below it), or embed them.'
  );
}

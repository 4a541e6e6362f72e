/**
 * The files of one build upload: the assets the command line matched, plus the side files
 * (buffers, images) each asset names inside its own folder, each under its path relative to a
 * common root, with its size. The server receives them under exactly these paths,
 * so an asset finds its `.bin` beside it there as it does on disk.
 */
import { open, realpath, stat } from 'node:fs/promises';
import { dirname, relative, resolve, sep } from 'node:path';
import pLimit from 'p-limit';
import { CliError } from './cli-error';
import { ExitCode } from './exit-codes';
import type { InputFile } from './files';
import { isInside } from './is-inside';
import { isMissing } from './is-missing';
import { listSideFileReferences } from './side-file-paths';

/** Files opened at once while collecting: well below any open-file limit. */
const CONCURRENT_READS = 16;

/** One file to upload. */
export interface UploadFile {
  /** Relative to the root, forward slashes: the name the server and its reports use. */
  uploadPath: string;
  absolutePath: string;
  byteLength: number;
  /** Matched on the command line (an asset), rather than named by one as a side file. */
  isAsset: boolean;
}

/**
 * The upload's files in path order, side files included and each path once.
 * @param warn receives one line per side file that is not uploaded (refused, missing), without prefix.
 * @throws CliError (exit 2) `input.outside-root` for an asset outside `rootPath`, `input.path-invalid`
 *   for a name the server cannot take, `input.unreadable` for a file that cannot be read.
 */
export async function collectUploadFiles(
  assets: readonly InputFile[],
  rootPath: string,
  warn: (line: string) => void
): Promise<UploadFile[]> {
  const byUploadPath = new Map<string, { absolutePath: string; isAsset: boolean }>();
  for (const asset of assets) {
    const assetUploadPath = toUploadPath(rootPath, asset.absolutePath, asset.displayPath);
    byUploadPath.set(assetUploadPath, { absolutePath: asset.absolutePath, isAsset: true });
  }
  // The files are read a few at a time: one after another, the waits on the disk added up to
  // 45 ms for 50 assets, longer than the rest of submit's preparation.
  const limit = pLimit(CONCURRENT_READS);
  const assetEntries = [...byUploadPath];
  const sideFileLists = await Promise.all(
    assetEntries.map(([assetUploadPath, { absolutePath }]) => limit(() => findSideFiles(absolutePath, assetUploadPath)))
  );
  // In the assets' order, so warnings and the choice between a matched and a named file do not depend on timing.
  for (const { sideFiles, warnings } of sideFileLists) {
    warnings.forEach(warn);
    for (const sideFile of sideFiles) {
      const uploadPath = toUploadPath(rootPath, sideFile, sideFile);
      // A file both matched and named by another asset stays an asset.
      if (!byUploadPath.has(uploadPath)) byUploadPath.set(uploadPath, { absolutePath: sideFile, isAsset: false });
    }
  }
  const uploadPaths = [...byUploadPath.keys()].sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
  return Promise.all(
    uploadPaths.map((uploadPath) =>
      limit(async (): Promise<UploadFile> => {
        const { absolutePath, isAsset } = byUploadPath.get(uploadPath)!;
        return { uploadPath, absolutePath, isAsset, ...(await measure(absolutePath, uploadPath)) };
      })
    )
  );
}

/**
 * The absolute paths of the side files an asset names that exist inside its folder: the URI
 * is resolved against the folder, and its real path (symlinks followed) must stay inside the
 * folder's real path, as `check` requires before reading one. Also the warnings for the side
 * files it leaves out, for the caller to print in the assets' order.
 */
async function findSideFiles(
  assetPath: string,
  assetUploadPath: string
): Promise<{ sideFiles: string[]; warnings: string[] }> {
  const warnings: string[] = [];
  const warn = (line: string) => warnings.push(line);
  const folder = dirname(assetPath);
  const realFolder = await realpath(folder);
  const found: string[] = [];
  for (const reference of await listSideFileReferences(assetPath)) {
    const named = `${assetUploadPath}: ${reference.where}.uri "${reference.uri}"`;
    if (reference.path === null) {
      warn(`${named} ${reference.refusal}; not uploaded (the server will report the asset)`);
      continue;
    }
    const candidate = resolve(folder, ...reference.path.split('/'));
    let realCandidate: string;
    try {
      realCandidate = await realpath(candidate);
    } catch (error) {
      if (!isMissing(error)) throw unreadable(reference.path, error);
      warn(`${named} names a file that does not exist; not uploaded (the server will report the asset)`);
      continue;
    }
    if (!isInside(realFolder, realCandidate)) {
      warn(`${named} resolves outside the asset's folder through a link; not uploaded`);
      continue;
    }
    // Only regular files: a FIFO or device below the folder would block or stream forever.
    if (!(await stat(realCandidate)).isFile()) {
      warn(`${named} is not a regular file; not uploaded`);
      continue;
    }
    found.push(candidate);
  }
  return { sideFiles: found, warnings };
}

/** `absolutePath` relative to the root, with forward slashes, checked for what the server refuses. */
function toUploadPath(rootPath: string, absolutePath: string, shownPath: string): string {
  if (!isInside(rootPath, absolutePath)) {
    throw new CliError(
      'input.outside-root',
      `${shownPath} is outside the root folder ${rootPath}; pass --root with a folder that holds every file`,
      ExitCode.UsageError
    );
  }
  const uploadPath = relative(rootPath, absolutePath).split(sep).join('/');
  // The server refuses these in upload paths (backslashes are separators elsewhere; control
  // characters cannot travel in a multipart header).
  // eslint-disable-next-line no-control-regex -- control characters are what is refused
  if (uploadPath.includes('\\') || /[\u0000-\u001f\u007f]/.test(uploadPath)) {
    throw new CliError(
      'input.path-invalid',
      `${JSON.stringify(uploadPath)}: a file name with a backslash or control character cannot be uploaded; rename it`,
      ExitCode.UsageError
    );
  }
  return uploadPath;
}

/**
 * Size of a file, opened once so an unreadable file is reported before the upload starts. The
 * content is hashed as it uploads (see multipart-body.ts): a reading pass here, before the first
 * byte is sent, measured 0.15 s of the 1.5 s submission of the ingest benchmark's 100 MB.
 */
async function measure(absolutePath: string, uploadPath: string): Promise<{ byteLength: number }> {
  try {
    const file = await open(absolutePath, 'r');
    try {
      return { byteLength: (await file.stat()).size };
    } finally {
      await file.close();
    }
  } catch (error) {
    throw unreadable(uploadPath, error);
  }
}

function unreadable(path: string, error: unknown): CliError {
  const reason = (error as { code?: string }).code ?? (error as Error).message;
  return new CliError('input.unreadable', `${path}: cannot read the file (${reason})`, ExitCode.UsageError, {
    cause: error
  });
}

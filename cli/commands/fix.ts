/**
 * `orientry fix`: writes a corrected copy of one asset. The input is never written unless
 * `--in-place` says so, and no output file may land on a file the input was read from.
 * What was applied and the finding counts before and after go to stderr.
 */
import { mkdir, realpath, rename, rm, writeFile } from 'node:fs/promises';
import { dirname, resolve } from 'node:path';
import type { Document } from '@gltf-transform/core';
import {
  countBySeverity,
  FIXES,
  fixDocument,
  isAssetReadError,
  isFixable,
  lintAsset,
  lintDocument,
  readAsset,
  type AssetReport,
  type AssetSource,
  type Finding,
  type FixResult,
  type Policy,
  type ReadAssetResult,
  type ReadOptions,
  type RuleId
} from '$lib/lint';
import type { FixOptions } from '../args';
import { CliError } from '../cli-error';
import type { CommandContext } from '../command-context';
import { getReadOptions } from '../draco';
import { encodeAsset, type EncodedFile } from '../encode-asset';
import { ExitCode } from '../exit-codes';
import { readAssetSource, type InputFile } from '../files';
import { plural } from '../plural';
import { loadPolicy } from '../policy-file';

/** Runs `orientry fix` and returns the exit code. */
export async function fix(options: FixOptions, context: CommandContext): Promise<ExitCode> {
  const policy = await loadPolicy(options.policyPath, context.cwd);
  const rules = checkRules(options.rules);
  const input: InputFile = { absolutePath: resolve(context.cwd, options.inputPath), displayPath: options.inputPath };
  const outputPath = await chooseOutputPath(options, input.absolutePath, context.cwd);

  const readPaths = new Set<string>();
  const source = await readInput(input, readPaths);
  // One read serves both the "before" lint and the fix; images are read too, as the copy needs them.
  const document = await readDocument(source, { ...(await getReadOptions(source.bytes)), includeImages: true });
  const before = lintDocument(document, source.path, policy).findings;
  const { results } = await fixDocument(document, policy, rules ?? undefined);
  const encoded = await encodeAsset(document, outputPath);
  if (!options.isInPlace) await refuseOverwritingInput(encoded.files, readPaths);
  for (const file of encoded.files) await writeAtomically(file);

  const outputDisplayPath = options.outputPath ?? options.inputPath;
  const after = (await lintOutput({ absolutePath: outputPath, displayPath: outputDisplayPath }, policy)).findings;
  const lines = [
    `orientry: fixed ${input.displayPath} -> ${outputDisplayPath}`,
    `  applied: ${describeApplied(results)}`,
    `  findings before: ${formatCounts(before)}`,
    `  findings after:  ${formatCounts(after)}`,
    ...encoded.removedExtensions.map(
      (name) => `  note: ${name} removed; the copy stores its geometry uncompressed (re-encoding would be lossy)`
    )
  ];
  context.stderr.write(`${lines.join('\n')}\n`);
  return ExitCode.Pass;
}

/** Every requested rule must have a fix; naming one without is a usage error, not a silent no-op. */
function checkRules(rules: RuleId[] | null): RuleId[] | null {
  if (rules === null) return null;
  const unfixable = rules.filter((rule) => !isFixable(rule));
  if (unfixable.length > 0) {
    throw new CliError(
      'args.rule-not-fixable',
      `--rules: ${unfixable.join(', ')} ${unfixable.length === 1 ? 'has' : 'have'} no fix (fixable: ${Object.keys(FIXES).join(', ')})`
    );
  }
  return rules;
}

/**
 * The absolute output path. `-o` naming the input (directly or through a symlink) needs
 * `--in-place`; `--in-place` with `-o` elsewhere is contradictory.
 */
async function chooseOutputPath(options: FixOptions, inputPath: string, cwd: string): Promise<string> {
  if (options.outputPath === null) return inputPath;
  const outputPath = resolve(cwd, options.outputPath);
  const isSameFile =
    outputPath === inputPath || (await realpathOrSelf(outputPath)) === (await realpathOrSelf(inputPath));
  if (isSameFile && !options.isInPlace) {
    throw new CliError(
      'fix.overwrites-input',
      `-o ${options.outputPath} is the input file; pass --in-place to overwrite it, or choose another output`
    );
  }
  if (!isSameFile && options.isInPlace) {
    throw new CliError('args.invalid', '--in-place overwrites the input, but -o names another file; drop one of them');
  }
  return outputPath;
}

async function readInput(input: InputFile, readPaths: Set<string>) {
  try {
    readPaths.add(await realpath(input.absolutePath));
    return await readAssetSource(input, { onSideFileRead: (path) => readPaths.add(path) });
  } catch (error) {
    const reason = (error as { code?: string }).code ?? (error as Error).message;
    throw new CliError(
      'input.unreadable',
      `${input.displayPath}: cannot read the input (${reason})`,
      ExitCode.UsageError,
      {
        cause: error
      }
    );
  }
}

/** A .gltf copy's .bin or image must not land on a side file of the input either. */
async function refuseOverwritingInput(files: readonly EncodedFile[], readPaths: ReadonlySet<string>): Promise<void> {
  for (const file of files) {
    if (readPaths.has(file.path) || readPaths.has(await realpathOrSelf(file.path))) {
      throw new CliError(
        'fix.overwrites-input',
        `writing ${file.path} would overwrite a file the input was read from; choose another output name or folder, or pass --in-place`
      );
    }
  }
}

/** Writes beside the target and renames, so a failed write never leaves half a file (or half an input). */
async function writeAtomically(file: EncodedFile): Promise<void> {
  const temporaryPath = `${file.path}.orientry-${process.pid}.tmp`;
  try {
    await mkdir(dirname(file.path), { recursive: true });
    await writeFile(temporaryPath, file.bytes);
    await rename(temporaryPath, file.path);
  } catch (error) {
    await rm(temporaryPath, { force: true });
    const reason = (error as { code?: string }).code ?? (error as Error).message;
    throw new CliError(
      'output.unwritable',
      `${file.path}: cannot write the fixed asset (${reason})`,
      ExitCode.UsageError,
      {
        cause: error
      }
    );
  }
}

/** Reads the input Document; a file the library cannot read is an input error here (exit code 2). */
async function readDocument(source: AssetSource, options: ReadOptions): Promise<Document> {
  let read: ReadAssetResult;
  try {
    read = await readAsset(source, options);
  } catch (error) {
    if (!isAssetReadError(error)) throw error;
    throw new CliError('input.unreadable', `${error.message} ${error.hint}`, ExitCode.UsageError, { cause: error });
  }
  // The decoder is passed whenever the file names Draco; a skip here would drop geometry from the copy.
  if (read.skippedDracoPrimitives > 0) throw new Error(`${source.path}: Draco geometry was skipped while reading`);
  return read.document;
}

async function lintOutput(file: InputFile, policy: Policy): Promise<AssetReport> {
  const source = await readAssetSource(file);
  return lintAsset(source, policy, await getReadOptions(source.bytes));
}

/** `renormalize (6 keys), unflipHemispheres (2 keys)`, or a note that nothing needed fixing. */
function describeApplied(results: readonly FixResult[]): string {
  const changed = results.filter((result) => result.keysChanged > 0 || result.nodesChanged > 0);
  if (changed.length === 0) return 'nothing (no fixable finding)';
  return changed
    .map((result) => {
      const parts = [
        result.keysChanged > 0 ? plural(result.keysChanged, 'key') : null,
        result.nodesChanged > 0 ? plural(result.nodesChanged, 'node') : null
      ].filter((part) => part !== null);
      return `${result.fix} (${parts.join(', ')})`;
    })
    .join(', ');
}

function formatCounts(findings: readonly Finding[]): string {
  const counts = countBySeverity(findings);
  return `${plural(counts.error, 'error')}, ${plural(counts.warning, 'warning')}, ${counts.info} info`;
}

/** The real path, or the path itself while it does not exist yet. */
async function realpathOrSelf(path: string): Promise<string> {
  try {
    return await realpath(path);
  } catch (error) {
    if ((error as { code?: string }).code === 'ENOENT') return path;
    throw error;
  }
}

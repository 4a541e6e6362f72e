/**
 * `orientry check`: lints assets offline and writes one report. The report goes to stdout (or
 * `--output`), everything else to stderr, and the exit code tells CI whether anything reached
 * the failing severity.
 */
import { mkdir, writeFile } from 'node:fs/promises';
import { dirname, resolve } from 'node:path';
import {
  buildLintReport,
  gateFailures,
  isAssetIncluded,
  lintAsset,
  type AssetReport,
  type AssetSource,
  type LintReport,
  toJsonReport,
  toJunitXml,
  toSarif,
  toTextSummary,
  type Policy
} from '$lib/lint';
import type { CheckOptions, ReportFormat } from '../args';
import { CliError } from '../cli-error';
import type { CommandContext } from '../command-context';
import { getReadOptions } from '../draco';
import { ExitCode } from '../exit-codes';
import { expandInputs, readAssetSource, type InputFile } from '../files';
import { plural } from '../plural';
import { loadPolicy } from '../policy-file';
import { createProgress } from '../progress';
import { unreadableAssetReport } from '../unreadable-asset-report';

/** Runs `orientry check` and returns the exit code. */
export async function check(options: CheckOptions, context: CommandContext): Promise<ExitCode> {
  const policy = await loadPolicy(options.policyPath, context.cwd);
  const { files, unmatchedPatterns } = await expandInputs(options.inputs, context.cwd);
  for (const pattern of unmatchedPatterns) {
    context.stderr.write(`orientry: warning: "${pattern}" matched no .glb or .gltf file\n`);
  }

  const progress = createProgress(context.stderr, options.isProgressForced);
  const assets: AssetReport[] = [];
  for (const [index, file] of files.entries()) {
    progress.step(index, files.length, file.displayPath);
    assets.push(await lintFile(file, policy));
  }
  progress.finish();

  const report = buildLintReport(assets, policy);
  // --fail-on moves only the gate; the report keeps the policy's own version.
  const gatePolicy: Policy = options.failOn ? { ...policy, gate: { ...policy.gate, failOn: options.failOn } } : policy;
  const failures = gateFailures(
    report.assets.flatMap((asset) => asset.findings),
    gatePolicy
  );

  const isColor = context.isColorAllowed && options.outputPath === null;
  const text = formatReport(report, options.format, isColor);
  if (options.outputPath === null) {
    context.stdout.write(text);
  } else {
    await writeReport(resolve(context.cwd, options.outputPath), text, options.outputPath);
    context.stderr.write(`${summaryLine(report, failures.length, gatePolicy, options.outputPath)}\n`);
  }
  return failures.length > 0 ? ExitCode.GateFailed : ExitCode.Pass;
}

/** Lints one file; a main file that cannot even be read becomes an `asset-unreadable` finding. */
async function lintFile(file: InputFile, policy: Policy): Promise<AssetReport> {
  // The library reports an excluded asset as skipped without looking at its bytes; don't read them.
  if (!isAssetIncluded(file.displayPath, policy)) return lintAsset(unreadSource(file.displayPath), policy);
  let source: AssetSource;
  try {
    source = await readAssetSource(file);
  } catch (error) {
    return unreadableAssetReport(file.displayPath, error, policy);
  }
  return lintAsset(source, policy, await getReadOptions(source.bytes));
}

/** A source with no bytes, for an asset the policy excludes (lintAsset skips it unread). */
function unreadSource(path: string): AssetSource {
  return { path, bytes: new Uint8Array(0), readSideFile: async () => null };
}

/** Renders the report in the chosen format. */
export function formatReport(report: LintReport, format: ReportFormat, isColor: boolean): string {
  switch (format) {
    case 'text':
      return toTextSummary(report, { color: isColor });
    case 'json':
      return toJsonReport(report);
    case 'sarif':
      return toSarif(report);
    case 'junit':
      return toJunitXml(report);
  }
}

async function writeReport(absolutePath: string, text: string, shownPath: string): Promise<void> {
  try {
    await mkdir(dirname(absolutePath), { recursive: true });
    await writeFile(absolutePath, text);
  } catch (error) {
    const reason = (error as { code?: string }).code ?? (error as Error).message;
    throw new CliError('output.unwritable', `${shownPath}: cannot write the report (${reason})`, ExitCode.UsageError, {
      cause: error
    });
  }
}

/** `orientry: 3 assets, 2 errors, 1 warning, 0 info; gate failed (2 at error or above); report in out.sarif` */
function summaryLine(report: LintReport, failureCount: number, gatePolicy: Policy, outputPath: string): string {
  const { summary } = report;
  const counts = [
    plural(summary.assets, 'asset'),
    plural(summary.error, 'error'),
    plural(summary.warning, 'warning'),
    `${summary.info} info`
  ].join(', ');
  const failOn = gatePolicy.gate.failOn;
  const gate =
    failureCount > 0
      ? `gate failed (${failureCount} at ${failOn} or above)`
      : `gate passed (nothing at ${failOn} or above)`;
  return `orientry: ${counts}; ${gate}; report in ${outputPath}`;
}

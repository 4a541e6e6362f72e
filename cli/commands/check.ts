/**
 * `orientry check`: lints assets offline and writes one report. The report goes to stdout (or
 * `--output`), everything else to stderr, and the exit code tells CI whether anything reached
 * the failing severity.
 */
import { resolve } from 'node:path';
import { buildLintReport, gateFailures, type AssetReport, type LintReport, type Policy } from '$lib/lint';
import type { CheckOptions } from '../args';
import type { CommandContext } from '../command-context';
import { ExitCode } from '../exit-codes';
import { expandInputs } from '../files';
import { formatReport } from '../format-report';
import { lintInputFile } from '../lint-input-file';
import { plural } from '../plural';
import { loadPolicy } from '../policy-file';
import { createProgress } from '../progress';
import { writeReportFile } from '../write-report-file';

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
    assets.push(await lintInputFile(file, policy));
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
    await writeReportFile(resolve(context.cwd, options.outputPath), text, options.outputPath);
    context.stderr.write(`${summaryLine(report, failures.length, gatePolicy, options.outputPath)}\n`);
  }
  return failures.length > 0 ? ExitCode.GateFailed : ExitCode.Pass;
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

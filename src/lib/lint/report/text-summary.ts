/**
 * The human-readable summary the CLI prints to a terminal or CI log: per asset, findings grouped
 * by severity, then one line of totals. Plain ASCII markers (`error`, `warn`, `info`) so it reads
 * the same with and without colour; it is for people, not parsers (use the JSON report for that).
 */
import { SEVERITIES, type Finding, type Severity } from '../finding';
import type { AssetReport, LintReport } from '../lint-report';

export interface TextSummaryOptions {
  /** Wrap markers, paths and hints in ANSI SGR colour codes. Off by default, so logs and files stay clean. */
  color?: boolean;
}

export const TEXT_SUMMARY_DEFAULTS: Required<TextSummaryOptions> = { color: false };

const MARKERS: Record<Severity, string> = { error: 'error', warning: 'warn ', info: 'info ' };

/** SGR codes: red, yellow and cyan for the severities; bold for asset paths; dim for hints. */
const SGR = { error: '31', warning: '33', info: '36', bold: '1', dim: '2' } as const;

/** Continuation lines align under the rule id: two spaces, the 5-wide marker, two spaces. */
const INDENT = ' '.repeat(9);

/**
 * Renders a report as a terminal summary.
 *
 * @example
 * toTextSummary(report)
 * // characters/harbor-keeper.glb  2 findings (1 error, 1 warning)
 * //   error  hemisphere-jump  /Keeper/Hips/Spine  Walk channel 3  keys 4-5  t=0.167s
 * //          CUBICSPLINE keys 4 and 5 lie in opposite hemispheres (dot -0.412) ...
 * //          hint: Negate key 5 and its tangents, and every later key, so neighbours share a sign.
 * //   ...
 * // 1 asset, 2 findings: 1 error, 1 warning, 0 info
 */
export function toTextSummary(report: LintReport, options: TextSummaryOptions = {}): string {
  const { color } = { ...TEXT_SUMMARY_DEFAULTS, ...options };
  const paint = (code: string, text: string) => (color ? `\u001b[${code}m${text}\u001b[0m` : text);

  const lines: string[] = [];
  for (const asset of report.assets) {
    lines.push(`${paint(SGR.bold, asset.path)}  ${describeAssetState(asset)}`);
    for (const severity of SEVERITIES)
      for (const finding of asset.findings.filter((candidate) => candidate.severity === severity)) {
        lines.push(`  ${paint(SGR[severity], MARKERS[severity])}  ${describeWhere(finding)}`);
        lines.push(`${INDENT}${finding.message}`);
        if (finding.hint) lines.push(`${INDENT}${paint(SGR.dim, `hint: ${finding.hint}`)}`);
      }
  }
  if (lines.length > 0) lines.push('');
  const { summary } = report;
  lines.push(
    `${plural(summary.assets, 'asset')}, ${plural(summary.findings, 'finding')}: ` +
      `${plural(summary.error, 'error')}, ${plural(summary.warning, 'warning')}, ${summary.info} info`
  );
  return `${lines.join('\n')}\n`;
}

function describeAssetState(asset: AssetReport): string {
  if (asset.skipped) return 'skipped by the policy';
  const counts = SEVERITIES.map(
    (severity) => [severity, asset.findings.filter((f) => f.severity === severity).length] as const
  )
    .filter(([, count]) => count > 0)
    .map(([severity, count]) => (severity === 'info' ? `${count} info` : plural(count, severity)));
  const state = asset.unreadable ? 'unreadable' : asset.findings.length === 0 ? 'clean' : null;
  if (state && counts.length === 0) return state;
  const total = `${plural(asset.findings.length, 'finding')} (${counts.join(', ')})`;
  return state ? `${state}, ${total}` : total;
}

/** `rule  node  animation channel N  keys a-b  t=0.125s`, leaving out whatever the finding lacks. */
function describeWhere(finding: Finding): string {
  const parts = [finding.rule];
  if (finding.node !== null) parts.push(finding.node);
  if (finding.animation !== null)
    parts.push(finding.channel === null ? finding.animation : `${finding.animation} channel ${finding.channel}`);
  if (finding.keys)
    parts.push(
      finding.keys[0] === finding.keys[1] ? `key ${finding.keys[0]}` : `keys ${finding.keys[0]}-${finding.keys[1]}`
    );
  if (finding.time !== null && Number.isFinite(finding.time)) parts.push(`t=${Number(finding.time.toFixed(3))}s`);
  return parts.join('  ');
}

function plural(count: number, noun: string): string {
  return `${count} ${noun}${count === 1 ? '' : 's'}`;
}

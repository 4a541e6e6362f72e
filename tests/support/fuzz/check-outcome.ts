/**
 * What counts as a clear outcome for one fuzzed asset, shared by the engine and route fuzz tests:
 * either one `asset-unreadable` finding carrying a known reader code and a short message and hint,
 * or a normal report whose findings all name known rules. Returns the problems found, empty when
 * the outcome is clear.
 */
import { ASSET_READ_ERROR_CODES, RULE_IDS, SEVERITIES } from '$lib/lint/index';

/** The parts of an asset report (from the library or from the API) the check reads. */
export interface OutcomeReport {
  unreadable: boolean;
  findings: readonly { rule: string; severity: string; message: string; values?: unknown; hint?: string | null }[];
}

/** Longest message an unreadable finding may carry: a reader must quote, not dump, what it found. */
export const MAX_UNREADABLE_MESSAGE_LENGTH = 2_000;

/** Problems with `report` as the outcome of linting a damaged file; empty when it is clear. */
export function outcomeProblems(report: OutcomeReport): string[] {
  const problems: string[] = [];
  for (const finding of report.findings) {
    if (!(RULE_IDS as readonly string[]).includes(finding.rule)) problems.push(`unknown rule "${finding.rule}"`);
    if (!(SEVERITIES as readonly string[]).includes(finding.severity)) {
      problems.push(`unknown severity "${finding.severity}"`);
    }
    if (typeof finding.message !== 'string' || finding.message.length === 0) problems.push('a finding has no message');
  }
  if (!report.unreadable) {
    if (report.findings.some((finding) => finding.rule === 'asset-unreadable')) {
      problems.push('asset-unreadable finding on a readable asset');
    }
    return problems;
  }
  if (report.findings.length !== 1 || report.findings[0].rule !== 'asset-unreadable') {
    problems.push(`unreadable, but findings are [${report.findings.map((finding) => finding.rule).join(', ')}]`);
    return problems;
  }
  const [finding] = report.findings;
  const code = (finding.values as { code?: unknown } | undefined)?.code;
  if (!(ASSET_READ_ERROR_CODES as readonly unknown[]).includes(code)) problems.push(`unknown reader code ${code}`);
  if (finding.message.length > MAX_UNREADABLE_MESSAGE_LENGTH) {
    problems.push(`message of ${finding.message.length} characters (limit ${MAX_UNREADABLE_MESSAGE_LENGTH})`);
  }
  if (!finding.hint) problems.push('no hint saying what to do');
  return problems;
}

/** The reader code of an unreadable report, or null. */
export function unreadableCodeOf(report: OutcomeReport): string | null {
  if (!report.unreadable) return null;
  return String((report.findings[0]?.values as { code?: unknown } | undefined)?.code ?? '');
}

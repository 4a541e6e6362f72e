/**
 * JUnit XML output, for the test-result panels CI systems draw from `<testsuites>` files.
 * Each asset is a test suite and each rule a test case, so a panel shows at a glance which
 * rules an asset breaks.
 *
 * Design notes: info findings never fail a test case (they go to `<system-out>`), warnings and
 * errors do. An unreadable asset is a JUnit *error* (the checks could not run), not a failure,
 * and its other test cases are skipped. The CI gate is decided from findings and the policy,
 * never from this file.
 */
import { isAtLeast, SEVERITY_RANK, type Finding, type Severity } from '../finding';
import type { AssetReport, LintReport } from '../lint-report';
import { RULE_IDS } from '../rule-ids';

const UNREADABLE_RULE = 'asset-unreadable';

interface CaseOutcome {
  xml: string;
  failed: boolean;
  errored: boolean;
  skipped: boolean;
}

/**
 * Serialises a report as JUnit XML: `<testsuites>` with one `<testsuite>` per asset (name = asset
 * path) and one `<testcase>` per rule (classname = asset path, name = rule id).
 * All text is XML-escaped, and characters XML 1.0 cannot carry at all are replaced by U+FFFD.
 */
export function toJunitXml(report: LintReport): string {
  const ruleIds = listRuleIds(report);
  const suites = report.assets.map((asset) => toSuite(asset, ruleIds));
  const totals = suites.reduce(
    (sum, suite) => ({
      tests: sum.tests + suite.tests,
      failures: sum.failures + suite.failures,
      errors: sum.errors + suite.errors,
      skipped: sum.skipped + suite.skipped
    }),
    { tests: 0, failures: 0, errors: 0, skipped: 0 }
  );
  const lines = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<testsuites name="Orientry" tests="${totals.tests}" failures="${totals.failures}" errors="${totals.errors}" skipped="${totals.skipped}">`,
    ...suites.map((suite) => suite.xml),
    '</testsuites>'
  ];
  return `${lines.join('\n')}\n`;
}

function listRuleIds(report: LintReport): string[] {
  const ids: string[] = [...RULE_IDS];
  for (const asset of report.assets)
    for (const finding of asset.findings) if (!ids.includes(finding.rule)) ids.push(finding.rule);
  return ids;
}

function toSuite(asset: AssetReport, ruleIds: readonly string[]) {
  const outcomes = ruleIds.map((ruleId) => toCase(asset, ruleId));
  const count = (pick: (outcome: CaseOutcome) => boolean) => outcomes.filter(pick).length;
  const tests = outcomes.length;
  const failures = count((outcome) => outcome.failed);
  const errors = count((outcome) => outcome.errored);
  const skipped = count((outcome) => outcome.skipped);
  const open =
    `  <testsuite name="${escapeAttribute(asset.path)}" tests="${tests}" failures="${failures}" ` +
    `errors="${errors}" skipped="${skipped}">`;
  const xml = [open, ...outcomes.map((outcome) => outcome.xml), '  </testsuite>'].join('\n');
  return { xml, tests, failures, errors, skipped };
}

function toCase(asset: AssetReport, ruleId: string): CaseOutcome {
  const open = `    <testcase classname="${escapeAttribute(asset.path)}" name="${escapeAttribute(ruleId)}"`;
  const findings = asset.findings.filter((finding) => finding.rule === ruleId);

  if (asset.skipped) return skippedCase(open, "Left out by the policy's include/exclude globs.");
  if (asset.unreadable && ruleId !== UNREADABLE_RULE) return skippedCase(open, 'Not run: the asset could not be read.');

  const body: string[] = [];
  let failed = false;
  let errored = false;
  const blocking = findings.filter((finding) => isAtLeast(finding.severity, 'warning'));
  if (blocking.length > 0) {
    const element = ruleId === UNREADABLE_RULE ? 'error' : 'failure';
    const type = heaviestSeverity(blocking);
    const message =
      blocking.length === 1 ? blocking[0].message : `${blocking.length} findings. First: ${blocking[0].message}`;
    body.push(
      `      <${element} type="${type}" message="${escapeAttribute(message)}">` +
        `${escapeText(blocking.map(describeFinding).join('\n'))}</${element}>`
    );
    errored = element === 'error';
    failed = !errored;
  }
  const notes = findings.filter((finding) => !isAtLeast(finding.severity, 'warning'));
  if (notes.length > 0)
    body.push(`      <system-out>${escapeText(notes.map(describeFinding).join('\n'))}</system-out>`);

  const xml = body.length === 0 ? `${open}/>` : [`${open}>`, ...body, '    </testcase>'].join('\n');
  return { xml, failed, errored, skipped: false };
}

function skippedCase(open: string, reason: string): CaseOutcome {
  const xml = `${open}>\n      <skipped message="${escapeAttribute(reason)}"/>\n    </testcase>`;
  return { xml, failed: false, errored: false, skipped: true };
}

function heaviestSeverity(findings: readonly Finding[]): Severity {
  return findings.reduce<Severity>(
    (heaviest, finding) => (SEVERITY_RANK[finding.severity] > SEVERITY_RANK[heaviest] ? finding.severity : heaviest),
    'info'
  );
}

/** One line per finding: `warning /Hips · Walk channel 3 · keys 11-12 · t=0.458 s: message Hint: hint`. */
function describeFinding(finding: Finding): string {
  const where: string[] = [finding.node ?? finding.asset];
  if (finding.animation !== null)
    where.push(finding.channel === null ? finding.animation : `${finding.animation} channel ${finding.channel}`);
  if (finding.keys) where.push(`keys ${finding.keys[0]}-${finding.keys[1]}`);
  if (finding.time !== null && Number.isFinite(finding.time)) where.push(`t=${Number(finding.time.toFixed(3))} s`);
  return `${finding.severity} ${where.join(' · ')}: ${finding.message} Hint: ${finding.hint}`;
}

/**
 * XML 1.0 §2.2 allows only tab, LF, CR and U+0020 upward (minus surrogates and U+FFFE/U+FFFF);
 * anything else cannot even be escaped, so it becomes U+FFFD.
 */
function toXmlChars(text: string): string {
  return text.replace(
    // eslint-disable-next-line no-control-regex -- matching control characters is the point
    /[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g,
    '\uFFFD'
  );
}

/**
 * Character data: `&`, `<` and `>` escaped (`>` too, so `]]>` can never appear), and CR as a
 * reference because parsers turn a literal CR into LF (XML 1.0 §2.11).
 */
function escapeText(text: string): string {
  return toXmlChars(text).replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/\r/g, '&#13;');
}

/** Attribute values: also quotes, and whitespace as references so attribute normalisation keeps it. */
function escapeAttribute(text: string): string {
  return escapeText(text)
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&apos;')
    .replace(/\t/g, '&#9;')
    .replace(/\n/g, '&#10;');
}

/**
 * Report formats: pure functions from a LintReport to text. The CLI picks one by `--format`,
 * the server stores the JSON one; docs/report-format.md describes all four.
 */
export { toJsonReport } from './json-report';
export { toSarif, SARIF_FINGERPRINT_KEY } from './sarif';
export { toJunitXml } from './junit-xml';
export { toTextSummary, TEXT_SUMMARY_DEFAULTS, type TextSummaryOptions } from './text-summary';

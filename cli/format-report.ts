/**
 * A lint report in one of the CLI's formats: the library's renderers behind one switch, shared
 * by `check` (its report) and `submit` (a report rendered on this machine when the server gives none).
 */
import { toJsonReport, toJunitXml, toSarif, toTextSummary, type LintReport } from '$lib/lint';
import type { ReportFormat } from './option-spec';

/** Renders the report in the chosen format; `isColor` only affects text. */
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

/**
 * A stored build as a downloadable lint report in the library's formats (our JSON report,
 * SARIF 2.1.0, JUnit XML), for CI systems and code-scanning tools that read them.
 */
import type { AssetReport, AssetStats, LintReport } from '../../lint/lint-report';
import { countBySeverity } from '../../lint/lint-report';
import { toJsonReport } from '../../lint/report/json-report';
import { toJunitXml } from '../../lint/report/junit-xml';
import { toSarif } from '../../lint/report/sarif';
import { Asset, Build, FindingRecord } from '../db/models';
import { findingOf } from './finding-columns';

/** Export formats: file extension, media type and writer. */
export const REPORT_FORMATS = {
  json: { extension: 'json', contentType: 'application/json; charset=utf-8', write: toJsonReport },
  sarif: { extension: 'sarif', contentType: 'application/sarif+json; charset=utf-8', write: toSarif },
  junit: { extension: 'xml', contentType: 'application/xml; charset=utf-8', write: toJunitXml }
} as const;

/** A format name: `json`, `sarif` or `junit`. */
export type ReportFormat = keyof typeof REPORT_FORMATS;

/** True for a format name the export knows. */
export function isReportFormat(name: string): name is ReportFormat {
  return Object.hasOwn(REPORT_FORMATS, name);
}

/** A rendered report file. */
export interface ReportFile {
  fileName: string;
  contentType: string;
  body: string;
}

/**
 * The build's report: its checked assets with their present findings (new and unchanged,
 * waived ones included: the report lists what is in the files), under the policy and engine
 * versions the build was linted with.
 */
export async function exportBuildReport(build: Build, projectSlug: string, format: ReportFormat): Promise<ReportFile> {
  const report = await lintReportOf(build);
  const { extension, contentType, write } = REPORT_FORMATS[format];
  return { fileName: `orientry-${projectSlug}-build-${build.id}.${extension}`, contentType, body: write(report) };
}

/** Rebuilds the LintReport of a stored build. */
export async function lintReportOf(build: Build): Promise<LintReport> {
  const [assets, rows] = await Promise.all([
    Asset.findAll({ where: { buildId: build.id }, order: [['path', 'ASC']] }),
    FindingRecord.findAll({ where: { buildId: build.id, status: ['new', 'unchanged'] }, order: [['id', 'ASC']] })
  ]);
  const byAsset = new Map<number, ReturnType<typeof findingOf>[]>();
  for (const row of rows) {
    if (row.assetId === null) continue;
    const list = byAsset.get(row.assetId) ?? [];
    list.push(findingOf(row));
    byAsset.set(row.assetId, list);
  }
  const assetReports: AssetReport[] = assets.map((asset) => ({
    path: asset.path,
    byteLength: asset.byteLength,
    unreadable: asset.unreadable,
    skipped: false,
    stats: asset.statsJson
      ? (JSON.parse(asset.statsJson) as AssetStats)
      : { animations: 0, rotationChannels: 0, rotationKeys: 0, nodesWithRotation: 0 },
    findings: byAsset.get(asset.id) ?? []
  }));
  const findings = assetReports.flatMap((asset) => asset.findings);
  return {
    schema: 'orientry.lint-report',
    schemaVersion: 1,
    tool: { name: 'orientry', version: build.engineVersion },
    policyVersion: build.policyVersion,
    assets: assetReports,
    summary: { ...countBySeverity(findings), assets: assetReports.length, findings: findings.length }
  };
}

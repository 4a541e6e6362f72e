/**
 * A stored build as a downloadable lint report in the library's formats (our JSON report,
 * SARIF 2.1.0, JUnit XML), for CI systems and code-scanning tools that read them. JSON and
 * SARIF also carry each finding's standing against the baseline and its waiver, and the build's
 * verdict (see report-standing.ts).
 */
import type { AssetReport, AssetStats, LintReport } from '../../lint/lint-report';
import { countBySeverity } from '../../lint/lint-report';
import { toJsonReport } from '../../lint/report/json-report';
import { toJunitXml } from '../../lint/report/junit-xml';
import { toSarif } from '../../lint/report/sarif';
import type { Finding } from '../../lint/finding';
import { Asset, Build, FindingRecord, Waiver } from '../db/models';
import { summarizeBuild, type BuildSummary } from './build-summary';
import { findingOf } from './finding-columns';
import { addStandingToJson, addStandingToSarif, type FindingStanding } from './report-standing';

/** Export formats: file extension, media type and writer (with the build's standing where the format has room). */
export const REPORT_FORMATS = {
  json: {
    extension: 'json',
    contentType: 'application/json; charset=utf-8',
    write: (stored: StoredReport, build: BuildSummary) =>
      addStandingToJson(toJsonReport(stored.report), stored.standings, build)
  },
  sarif: {
    extension: 'sarif',
    contentType: 'application/sarif+json; charset=utf-8',
    write: (stored: StoredReport, build: BuildSummary) =>
      addStandingToSarif(toSarif(stored.report), stored.standings, build)
  },
  junit: {
    extension: 'xml',
    contentType: 'application/xml; charset=utf-8',
    write: (stored: StoredReport) => toJunitXml(stored.report)
  }
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

/** A stored build's lint report with the standing of each of its findings, in report order. */
export interface StoredReport {
  report: LintReport;
  standings: FindingStanding[];
}

/**
 * The build's report: its checked assets with their present findings (new and unchanged,
 * waived ones included: the report lists what is in the files), under the policy and engine
 * versions the build was linted with.
 * @param origin the server's public origin, for the build's report URL inside the file.
 */
export async function exportBuildReport(
  build: Build,
  projectSlug: string,
  format: ReportFormat,
  origin: string
): Promise<ReportFile> {
  const stored = await storedReportOf(build);
  const { extension, contentType, write } = REPORT_FORMATS[format];
  return {
    fileName: `orientry-${projectSlug}-build-${build.id}.${extension}`,
    contentType,
    body: write(stored, summarizeBuild(build, projectSlug, origin))
  };
}

/** Rebuilds the LintReport of a stored build. */
export async function lintReportOf(build: Build): Promise<LintReport> {
  return (await storedReportOf(build)).report;
}

/** Rebuilds the LintReport of a stored build with each finding's standing. */
export async function storedReportOf(build: Build): Promise<StoredReport> {
  const [assets, rows] = await Promise.all([
    Asset.findAll({ where: { buildId: build.id }, order: [['path', 'ASC']] }),
    FindingRecord.findAll({ where: { buildId: build.id, status: ['new', 'unchanged'] }, order: [['id', 'ASC']] })
  ]);
  const waiverIds = [...new Set(rows.flatMap((row) => (row.waiverId === null ? [] : [row.waiverId])))];
  const waivers = new Map(
    (waiverIds.length === 0 ? [] : await Waiver.findAll({ where: { id: waiverIds } })).map((waiver) => [
      waiver.id,
      waiver
    ])
  );
  const byAsset = new Map<number, { finding: Finding; standing: FindingStanding }[]>();
  for (const row of rows) {
    if (row.assetId === null) continue;
    const waiver = row.waived && row.waiverId !== null ? (waivers.get(row.waiverId) ?? null) : null;
    const list = byAsset.get(row.assetId) ?? [];
    list.push({
      finding: findingOf(row),
      standing: {
        baselineStatus: row.status as FindingStanding['baselineStatus'],
        waiver: waiver && {
          id: waiver.id,
          reason: waiver.reason,
          expiresAt: waiver.expiresAt ? new Date(waiver.expiresAt).toISOString() : null
        }
      }
    });
    byAsset.set(row.assetId, list);
  }
  const standings: FindingStanding[] = [];
  const assetReports: AssetReport[] = assets.map((asset) => {
    const entries = byAsset.get(asset.id) ?? [];
    standings.push(...entries.map((entry) => entry.standing));
    return {
      path: asset.path,
      byteLength: asset.byteLength,
      unreadable: asset.unreadable,
      skipped: false,
      stats: asset.statsJson
        ? (JSON.parse(asset.statsJson) as AssetStats)
        : { animations: 0, rotationChannels: 0, rotationKeys: 0, nodesWithRotation: 0 },
      findings: entries.map((entry) => entry.finding)
    };
  });
  const findings = assetReports.flatMap((asset) => asset.findings);
  return {
    report: {
      schema: 'orientry.lint-report',
      schemaVersion: 1,
      tool: { name: 'orientry', version: build.engineVersion },
      policyVersion: build.policyVersion,
      assets: assetReports,
      summary: { ...countBySeverity(findings), assets: assetReports.length, findings: findings.length }
    },
    standings
  };
}

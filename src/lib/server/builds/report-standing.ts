/**
 * What only the server knows about a build's findings, added to its exported reports: each
 * finding's standing against the baseline build, the approved waiver that covers it, and the
 * build itself (verdict, counts, baseline). The lint library's writers render what is in the
 * files; this file adds the build's context on top, so a CI job that downloads the report sees
 * the same gate the server decided.
 *
 * Design notes: the additions go into places each format reserves for them rather than into the
 * library's writers, which stay pure and build-agnostic. SARIF 2.1.0 has `result.baselineState`
 * ("new", "unchanged") and `result.suppressions` (kind "external", status "accepted", with a
 * justification) for exactly this (OASIS SARIF 2.1.0 §3.27.23 and §3.27.24; section numbers
 * from memory); the run's property bag carries the build. Orientry's JSON report gains a
 * top-level `build` and two fields per finding, appended after the documented ones so readers
 * of schema version 1 keep working. JUnit XML has no place for either and is left as rendered.
 */
import type { BuildSummary } from './build-summary';

/** A present finding's standing, in the report's finding order. */
export interface FindingStanding {
  baselineStatus: 'new' | 'unchanged';
  /** The approved waiver covering it when the build was stored, or null. */
  waiver: { id: number; reason: string; expiresAt: string | null } | null;
}

/** The JSON report text with `build` after `policyVersion` and the standing on every finding. */
export function addStandingToJson(text: string, standings: readonly FindingStanding[], build: BuildSummary): string {
  const { schema, schemaVersion, tool, policyVersion, summary, assets } = JSON.parse(text) as {
    schema: string;
    schemaVersion: number;
    tool: unknown;
    policyVersion: string;
    summary: unknown;
    assets: { findings: Record<string, unknown>[] }[];
  };
  const next = cursor(standings);
  const annotated = assets.map((asset) => ({
    ...asset,
    findings: asset.findings.map((finding) => {
      const { baselineStatus, waiver } = next();
      return { ...finding, baselineStatus, waiver };
    })
  }));
  const ordered = { schema, schemaVersion, tool, policyVersion, build, summary, assets: annotated };
  return `${JSON.stringify(ordered, null, 2)}\n`;
}

/** The SARIF text with `baselineState` and waivers as suppressions on results, and the build in the run's properties. */
export function addStandingToSarif(text: string, standings: readonly FindingStanding[], build: BuildSummary): string {
  const log = JSON.parse(text) as {
    runs: { results: Record<string, unknown>[]; properties?: Record<string, unknown> }[];
  };
  const [run] = log.runs;
  const next = cursor(standings);
  run.results = run.results.map((result) => {
    const { baselineStatus, waiver } = next();
    if (!waiver) return { ...result, baselineState: baselineStatus };
    const suppression = {
      kind: 'external',
      status: 'accepted',
      justification: waiver.reason,
      properties: { waiverId: waiver.id, expiresAt: waiver.expiresAt }
    };
    return { ...result, baselineState: baselineStatus, suppressions: [suppression] };
  });
  run.properties = { ...run.properties, build };
  return `${JSON.stringify(log, null, 2)}\n`;
}

/**
 * Hands out the standings one by one. The writers emit findings in report order, so the k-th
 * finding written is the k-th standing; running out means the two lists disagree, a bug.
 */
function cursor(standings: readonly FindingStanding[]): () => FindingStanding {
  let index = 0;
  return () => {
    if (index >= standings.length) {
      throw new Error(`The report has more findings than the ${standings.length} standings read for it.`);
    }
    return standings[index++];
  };
}

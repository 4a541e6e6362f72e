/**
 * SARIF 2.1.0 output (OASIS Static Analysis Results Interchange Format), for code-scanning
 * dashboards. One run, one reporting descriptor per rule id, one result per finding.
 * Section numbers below refer to the OASIS SARIF 2.1.0 specification.
 */
import type { Finding, Severity } from '../finding';
import type { LintReport } from '../lint-report';
import { RULE_IDS } from '../rule-ids';
import { RULES } from '../rules/index';

const SARIF_SCHEMA = 'https://json.schemastore.org/sarif-2.1.0.json';

/** Partial-fingerprint key (§3.27.17): names what the value hashes, versioned so a new scheme gets a new key. */
export const SARIF_FINGERPRINT_KEY = 'orientry/v1';

type SarifLevel = 'error' | 'warning' | 'note';

const LEVELS: Record<Severity, SarifLevel> = { error: 'error', warning: 'warning', info: 'note' };

interface RuleText {
  title: string;
  rationale: string;
  source: string;
  defaultSeverity: Severity;
}

/** The reader emits `asset-unreadable` itself, so no rule object describes it. */
const ASSET_UNREADABLE: RuleText = {
  title: 'The asset could not be read as glTF 2.0.',
  rationale:
    'A file that does not parse as glTF 2.0 (bad JSON, a broken GLB container, a missing buffer) cannot be ' +
    'checked at all, so none of its rotations were examined.',
  source: 'glTF 2.0 §4 (GLB file format) and §3.6 (binary data storage)',
  defaultSeverity: 'error'
};

/**
 * Serialises a report as a SARIF 2.1.0 log: `$schema`, `version` "2.1.0" and exactly one run whose
 * driver lists every rule. Results carry the fingerprint as `partialFingerprints["orientry/v1"]` so
 * dashboards track a finding across builds the way Orientry's own baselines do.
 * Pure and deterministic: the same report gives the same text.
 */
export function toSarif(report: LintReport): string {
  const ruleIds = listRuleIds(report);
  const ruleIndex = new Map(ruleIds.map((id, index) => [id, index]));
  const artifactIndex = new Map(report.assets.map((asset, index) => [asset.path, index]));

  const results = report.assets.flatMap((asset) =>
    asset.findings.map((finding) => toResult(finding, ruleIndex.get(finding.rule) ?? 0, artifactIndex))
  );

  const log = {
    $schema: SARIF_SCHEMA,
    version: '2.1.0',
    runs: [
      {
        tool: {
          driver: {
            name: 'Orientry',
            version: report.tool.version,
            ...(isSemanticVersion(report.tool.version) ? { semanticVersion: report.tool.version } : {}),
            rules: ruleIds.map(toReportingDescriptor)
          }
        },
        artifacts: report.assets.map((asset) => ({
          location: { uri: toRelativeUri(asset.path) },
          length: asset.byteLength,
          properties: { unreadable: asset.unreadable, skipped: asset.skipped, stats: asset.stats }
        })),
        results,
        properties: { policyVersion: report.policyVersion }
      }
    ]
  };
  return `${JSON.stringify(log, null, 2)}\n`;
}

/** Every known rule id in the stable RULE_IDS order (so `ruleIndex` never shifts), then unknown ids seen. */
function listRuleIds(report: LintReport): string[] {
  const ids: string[] = [...RULE_IDS];
  for (const asset of report.assets)
    for (const finding of asset.findings) if (!ids.includes(finding.rule)) ids.push(finding.rule);
  return ids;
}

function ruleTextFor(id: string): RuleText | null {
  const rule = RULES.find((candidate) => candidate.id === id);
  if (rule) return rule;
  return id === 'asset-unreadable' ? ASSET_UNREADABLE : null;
}

/** A reportingDescriptor (§3.49); text fields only when a rule describes itself, never a placeholder. */
function toReportingDescriptor(id: string) {
  const text = ruleTextFor(id);
  return {
    id,
    name: toPascalCase(id),
    ...(text
      ? {
          shortDescription: { text: text.title },
          fullDescription: { text: text.rationale },
          help: { text: `Rests on: ${text.source}. Each result's properties.hint says how to fix that finding.` },
          defaultConfiguration: { level: LEVELS[text.defaultSeverity] }
        }
      : {})
  };
}

/** A result (§3.27) with one location: the asset as a physical location, the glTF objects as logical ones. */
function toResult(finding: Finding, ruleIndex: number, artifactIndex: Map<string, number>) {
  const index = artifactIndex.get(finding.asset);
  return {
    ruleId: finding.rule,
    ruleIndex,
    level: LEVELS[finding.severity],
    // §3.27.11: the message should let the reader resolve the problem, so the hint goes in too.
    message: { text: `${finding.message} ${finding.hint}` },
    locations: [
      {
        physicalLocation: {
          artifactLocation: { uri: toRelativeUri(finding.asset), ...(index === undefined ? {} : { index }) }
        },
        ...logicalLocationsOf(finding)
      }
    ],
    partialFingerprints: { [SARIF_FINGERPRINT_KEY]: finding.fingerprint },
    properties: { keys: finding.keys, time: finding.time, values: finding.values, hint: finding.hint }
  };
}

/**
 * Logical locations (§3.33) for the animation, channel and node. glTF is JSON and each of these
 * is a JSON object in it, so they use the JSON kind `object` (§3.33.7); the fully qualified
 * names tell them apart.
 */
function logicalLocationsOf(finding: Finding) {
  const locations: { name: string; fullyQualifiedName: string; kind: 'object' }[] = [];
  if (finding.animation !== null) {
    const animation = `animations/${finding.animation}`;
    locations.push({ name: finding.animation, fullyQualifiedName: animation, kind: 'object' });
    if (finding.channel !== null)
      locations.push({
        name: `channels/${finding.channel}`,
        fullyQualifiedName: `${animation}/channels/${finding.channel}`,
        kind: 'object'
      });
  }
  if (finding.node !== null) {
    const name = finding.node.split('/').filter(Boolean).pop() ?? finding.node;
    const path = finding.node.startsWith('/') ? finding.node : `/${finding.node}`;
    locations.push({ name, fullyQualifiedName: `nodes${path}`, kind: 'object' });
  }
  return locations.length > 0 ? { logicalLocations: locations } : {};
}

/** An asset path as a relative URI reference (§3.4.3): each segment percent-encoded, slashes kept. */
function toRelativeUri(path: string): string {
  return path.split('/').map(encodeURIComponent).join('/');
}

/** `hemisphere-jump` → `HemisphereJump`: SARIF suggests an identifier-like name (§3.49.7). */
function toPascalCase(id: string): string {
  return id
    .split(/[^A-Za-z0-9]+/)
    .filter(Boolean)
    .map((word) => word[0].toUpperCase() + word.slice(1))
    .join('');
}

function isSemanticVersion(version: string): boolean {
  return /^\d+\.\d+\.\d+(?:-[0-9A-Za-z.-]+)?(?:\+[0-9A-Za-z.-]+)?$/.test(version);
}

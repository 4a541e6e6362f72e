/**
 * Orientry's lint library: the public surface the CLI, the server and the browser import.
 * Pure: bytes and Documents in, data out; it never prints, exits, reads env vars or opens files.
 *
 * @example
 * const report = await lintAsset({ path: 'chars/hero.glb', bytes, readSideFile }, parsePolicy(json));
 * const failing = gateFailures(report.findings, policy);
 */
export { readAssetDocument, readAsset, type ReadOptions, type ReadAssetResult } from './read/read-asset-document';
export { readRotationChannels } from './read/read-rotation-channels';
export { readAssetFacts } from './read/read-asset-facts';
export { decodeNormalized, quantizationStepOf } from './read/decode-components';
export type { RotationChannel, Interpolation } from './read/rotation-channel';
export type { NodeFacts, SkinFacts, AssetFacts } from './read/node-facts';
export { lintDocument, type DocumentLintResult } from './lint-document';
export { lintAsset } from './lint-asset';
export { buildLintReport } from './build-lint-report';
export { gateFailures } from './gate';
export { isAssetIncluded } from './asset-filter';
export { AssetReadError, ASSET_READ_ERROR_CODES, isAssetReadError, type AssetReadErrorCode } from './asset-read-error';
export type { AssetSource } from './asset-source';
export {
  EULER_ORDERS,
  PolicyError,
  defaultPolicy,
  parsePolicy,
  policySchema,
  policyVersionOf,
  severityFor,
  type EulerOrder,
  type Policy,
  type PolicyInput,
  type SeverityOrOff
} from './policy';
export {
  SEVERITIES,
  SEVERITY_RANK,
  fingerprintOf,
  isAtLeast,
  type Finding,
  type FindingValues,
  type FingerprintParts,
  type Severity
} from './finding';
export { RULE_IDS, isRuleId, type RuleId } from './rule-ids';
export {
  countBySeverity,
  type AssetReport,
  type AssetStats,
  type LintReport,
  type SeverityCounts
} from './lint-report';
export { ENGINE_VERSION } from './version';
export { RULES } from './rules/index';
export type { Rule, ChannelRule, AssetRule, RuleContext, FindingDraft } from './rules/rule';
export * from './report/index';
export * from './fix/index';

/**
 * The shape every lint rule has. A rule is one exported object: its id, default severity,
 * the source it rests on, and a check that emits findings through the context.
 */
import type { Severity, FindingValues } from '../finding';
import type { Policy } from '../policy';
import type { RuleId } from '../rule-ids';
import type { RotationChannel } from '../read/rotation-channel';
import type { AssetFacts } from '../read/node-facts';

/** What a rule reports; the context adds rule, severity, asset and fingerprint. */
export interface FindingDraft {
  animation: string | null;
  channel: number | null;
  node: string | null;
  keys: [number, number] | null;
  time: number | null;
  values: FindingValues;
  message: string;
  hint: string;
  /** Extra fingerprint discriminator (e.g. `rest` for a rest rotation, a skin index). */
  target?: string;
  /**
   * Overrides the rule's severity for this finding (e.g. hemisphere-jump: error on CUBICSPLINE).
   * Rules that grade their findings set it through gradedSeverity(), so a severity the policy sets
   * for the rule still wins.
   */
  severity?: Severity;
}

export interface RuleContext {
  asset: string;
  policy: Policy;
  /** The rule's effective severity under the policy (never `off`: disabled rules are not run). */
  severity: Severity;
  emit(draft: FindingDraft): void;
}

interface RuleBase {
  id: RuleId;
  defaultSeverity: Severity;
  /** One line: what the rule catches. */
  title: string;
  /** Why it matters, for reports and SARIF `fullDescription`. */
  rationale: string;
  /** The spec section, paper or "common practice" it rests on. */
  source: string;
}

/** A rule over one rotation channel's keys. Must not allocate per key. */
export interface ChannelRule extends RuleBase {
  scope: 'channel';
  check(channel: RotationChannel, context: RuleContext): void;
}

/** A rule over the asset's nodes and skins (and, where it needs them, its rotation channels). */
export interface AssetRule extends RuleBase {
  scope: 'asset';
  check(facts: AssetFacts, channels: readonly RotationChannel[], context: RuleContext): void;
}

export type Rule = ChannelRule | AssetRule;

/**
 * Runs every enabled rule over one read Document and returns its findings and counts.
 * The one place a rule's draft becomes a {@link Finding}: severity, asset and fingerprint are
 * settled here, so every surface (CLI, server, browser) fingerprints findings identically.
 */
import type { Document } from '@gltf-transform/core';
import { SEVERITY_RANK, fingerprintOf, type Finding } from './finding';
import type { AssetStats } from './lint-report';
import { severityFor, type Policy } from './policy';
import type { AssetFacts } from './read/node-facts';
import { readAssetFacts } from './read/read-asset-facts';
import { readRotationChannels } from './read/read-rotation-channels';
import type { RotationChannel } from './read/rotation-channel';
import { RULES } from './rules/index';
import type { FindingDraft, Rule, RuleContext } from './rules/rule';

/** Findings (worst first, then in the order rules reported them) and counts for one asset. */
export interface DocumentLintResult {
  findings: Finding[];
  stats: AssetStats;
}

/**
 * Lints a Document read from `assetPath` under `policy`. Channel rules run once per rotation
 * channel, asset rules once; rules whose effective severity is `off` do not run at all.
 * @param rules the rule list; defaults to every rule in report order ({@link RULES}).
 */
export function lintDocument(
  document: Document,
  assetPath: string,
  policy: Policy,
  rules: readonly Rule[] = RULES
): DocumentLintResult {
  const channels = readRotationChannels(document);
  const facts = readAssetFacts(document);
  const findings = runRules(channels, facts, assetPath, policy, rules);

  let rotationKeys = 0;
  for (const channel of channels) rotationKeys += channel.keyCount;
  return {
    findings,
    stats: {
      animations: document.getRoot().listAnimations().length,
      rotationChannels: channels.length,
      rotationKeys,
      nodesWithRotation: facts.nodes.filter((node) => node.rotation !== null).length
    }
  };
}

/**
 * Runs `rules` over channels and facts already read from one asset: the rule pass of
 * {@link lintDocument}, exported so the engine benchmark times exactly the pass a lint runs.
 * Returns the findings worst first, then in the order rules reported them.
 */
export function runRules(
  channels: readonly RotationChannel[],
  facts: AssetFacts,
  assetPath: string,
  policy: Policy,
  rules: readonly Rule[] = RULES
): Finding[] {
  const findings: Finding[] = [];
  for (const rule of rules) {
    const effective = severityFor(policy, rule.id, rule.defaultSeverity);
    if (effective === 'off') continue;
    const context: RuleContext = {
      asset: assetPath,
      policy,
      severity: effective,
      emit: (draft: FindingDraft) => findings.push(toFinding(rule.id, effective, assetPath, draft))
    };
    if (rule.scope === 'channel') {
      for (const channel of channels) rule.check(channel, context);
    } else {
      rule.check(facts, channels, context);
    }
  }
  // Array.prototype.sort is stable (ECMAScript 2019), so equal severities keep report order.
  findings.sort((a, b) => SEVERITY_RANK[b.severity] - SEVERITY_RANK[a.severity]);
  return findings;
}

/**
 * A finding from a rule's draft. The fingerprint's target is the draft's own discriminator,
 * else `rotation` for channel findings (the animated property), else none.
 */
export function toFinding(rule: string, severity: Finding['severity'], asset: string, draft: FindingDraft): Finding {
  const target = draft.target ?? (draft.channel !== null ? 'rotation' : null);
  return {
    rule,
    severity: draft.severity ?? severity,
    asset,
    animation: draft.animation,
    channel: draft.channel,
    node: draft.node,
    keys: draft.keys,
    time: draft.time,
    values: draft.values,
    message: draft.message,
    hint: draft.hint,
    fingerprint: fingerprintOf({ rule, asset, animation: draft.animation, node: draft.node, target, time: draft.time })
  };
}

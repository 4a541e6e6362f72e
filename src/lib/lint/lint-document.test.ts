import { describe, expect, it } from 'vitest';
import { fingerprintOf } from './finding';
import { lintDocument } from './lint-document';
import { parsePolicy } from './policy';
import { buildAnimatedDocument } from './read/testing';
import type { AssetRule, ChannelRule, FindingDraft } from './rules/rule';

const KEYS = new Float32Array([0, 0, 0, 1, 0, 0.6, 0, 0.8]);

function twoChannelDocument() {
  return buildAnimatedDocument([
    { nodeName: 'Mast', interpolation: 'LINEAR', times: [0, 1], output: KEYS, restRotation: [0, 0, 0.6, 0.8] },
    { nodeName: 'Lantern', interpolation: 'STEP', times: [0, 1], output: KEYS }
  ]);
}

function draft(overrides: Partial<FindingDraft> = {}): FindingDraft {
  return {
    animation: 'Sway',
    channel: 0,
    node: '/Mast',
    keys: [0, 1],
    time: 0.5,
    values: { dot: -0.5 },
    message: 'The keys at 0.5 s turn the wrong way.',
    hint: 'Flip the sign of the second key.',
    ...overrides
  };
}

/** A channel rule that records the channels it saw and emits one finding per channel. */
function recordingChannelRule(id: ChannelRule['id'], seen: string[]): ChannelRule {
  return {
    id,
    scope: 'channel',
    defaultSeverity: 'warning',
    title: 'test rule',
    rationale: 'test rule',
    source: 'common practice',
    check(channel, context) {
      seen.push(channel.nodePath);
      context.emit(draft({ node: channel.nodePath, channel: channel.channelIndex }));
    }
  };
}

describe('lintDocument', () => {
  it('runs channel rules once per rotation channel and asset rules once', () => {
    const seen: string[] = [];
    let assetRuns = 0;
    const assetRule: AssetRule = {
      id: 'mirrored-basis',
      scope: 'asset',
      defaultSeverity: 'error',
      title: 'test rule',
      rationale: 'test rule',
      source: 'common practice',
      check(facts, channels, context) {
        assetRuns++;
        expect(facts.nodes).toHaveLength(2);
        expect(channels).toHaveLength(2);
        context.emit(draft({ animation: null, channel: null, node: '/Mast', keys: null, time: null, target: 'rest' }));
      }
    };
    const { findings, stats } = lintDocument(twoChannelDocument(), 'harbor/mast.glb', parsePolicy({}), [
      recordingChannelRule('wide-arc', seen),
      assetRule
    ]);
    expect(seen).toEqual(['/Mast', '/Lantern']);
    expect(assetRuns).toBe(1);
    expect(findings.map((finding) => finding.rule)).toEqual(['mirrored-basis', 'wide-arc', 'wide-arc']);
    expect(stats).toEqual({ animations: 1, rotationChannels: 2, rotationKeys: 4, nodesWithRotation: 1 });
  });

  it('does not run a rule the policy turns off', () => {
    const seen: string[] = [];
    const { findings } = lintDocument(twoChannelDocument(), 'mast.glb', parsePolicy({ rules: { 'wide-arc': 'off' } }), [
      recordingChannelRule('wide-arc', seen)
    ]);
    expect(seen).toEqual([]);
    expect(findings).toEqual([]);
  });

  it('applies the policy severity, and a draft severity over it', () => {
    const rule: ChannelRule = {
      ...recordingChannelRule('hemisphere-jump', []),
      check(channel, context) {
        context.emit(
          draft({ node: channel.nodePath, severity: channel.interpolation === 'STEP' ? 'error' : undefined })
        );
      }
    };
    const { findings } = lintDocument(
      twoChannelDocument(),
      'mast.glb',
      parsePolicy({ rules: { 'hemisphere-jump': 'info' } }),
      [rule]
    );
    // Worst first: the draft's own error, then the policy's info.
    expect(findings.map((finding) => [finding.node, finding.severity])).toEqual([
      ['/Lantern', 'error'],
      ['/Mast', 'info']
    ]);
  });

  it('sorts by severity and keeps report order within a severity', () => {
    const rules: ChannelRule[] = (['key-times', 'unit-drift', 'wide-arc'] as const).map((id, index) => ({
      ...recordingChannelRule(id, []),
      defaultSeverity: index === 1 ? 'error' : 'info'
    }));
    const { findings } = lintDocument(twoChannelDocument(), 'mast.glb', parsePolicy({}), rules);
    expect(findings.map((finding) => `${finding.severity}:${finding.rule}:${finding.node}`)).toEqual([
      'error:unit-drift:/Mast',
      'error:unit-drift:/Lantern',
      'info:key-times:/Mast',
      'info:key-times:/Lantern',
      'info:wide-arc:/Mast',
      'info:wide-arc:/Lantern'
    ]);
  });

  it('fingerprints from rule, asset, animation, node, target and time', () => {
    const { findings } = lintDocument(twoChannelDocument(), 'harbor/mast.glb', parsePolicy({}), [
      recordingChannelRule('wide-arc', [])
    ]);
    expect(findings[0]).toMatchObject({ rule: 'wide-arc', severity: 'warning', asset: 'harbor/mast.glb' });
    expect(findings[0].fingerprint).toBe(
      fingerprintOf({
        rule: 'wide-arc',
        asset: 'harbor/mast.glb',
        animation: 'Sway',
        node: '/Mast',
        target: 'rotation',
        time: 0.5
      })
    );
    expect(findings[0].fingerprint).not.toBe(findings[1].fingerprint);
  });
});

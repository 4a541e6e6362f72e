/**
 * Builders for rule tests: rotation channels and asset facts made directly from numbers, and a
 * small runner that applies the policy's severity the way the lint runner does. Rules are tested
 * on these so each test states exactly the keys it is about; document-level tests go through the
 * reader instead.
 */
import type { Severity } from '../finding';
import { parsePolicy, severityFor, type Policy, type PolicyInput } from '../policy';
import type { Interpolation, RotationChannel } from '../read/rotation-channel';
import type { AssetFacts, NodeFacts, SkinFacts } from '../read/node-facts';
import type { AssetRule, ChannelRule, FindingDraft, Rule, RuleContext } from './rule';

type Quat = readonly [number, number, number, number] | readonly number[];

/** What a test states about a channel; everything else gets a plain default. */
export interface ChannelSpec {
  interpolation: Interpolation;
  quats: readonly Quat[];
  /** Key times in seconds; defaults to 30 keys per second from 0. */
  times?: readonly number[];
  /** CUBICSPLINE tangents, one quaternion-shaped vector per key; default zeros. */
  inTangents?: readonly Quat[];
  outTangents?: readonly Quat[];
  animation?: string;
  channelIndex?: number;
  nodePath?: string;
  nodeIndex?: number;
  restRotation?: [number, number, number, number];
  isRoot?: boolean;
  raw?: Partial<RotationChannel['raw']>;
  quantizationStep?: number;
}

/** A RotationChannel built from plain arrays, as the reader would produce it. */
export function channelFrom(spec: ChannelSpec): RotationChannel {
  const keyCount = spec.quats.length;
  const times = Float32Array.from(spec.times ?? spec.quats.map((_, k) => k / 30));
  const isCubic = spec.interpolation === 'CUBICSPLINE';
  const zeros = spec.quats.map(() => [0, 0, 0, 0]);
  return {
    animation: spec.animation ?? 'Sway',
    animationIndex: 0,
    channelIndex: spec.channelIndex ?? 0,
    nodePath: spec.nodePath ?? '/Lantern',
    nodeIndex: spec.nodeIndex ?? 0,
    interpolation: spec.interpolation,
    times,
    values: flatten(spec.quats),
    inTangents: isCubic ? flatten(spec.inTangents ?? zeros) : null,
    outTangents: isCubic ? flatten(spec.outTangents ?? zeros) : null,
    keyCount: Math.min(keyCount, times.length),
    raw: {
      inputCount: times.length,
      outputCount: keyCount * (isCubic ? 3 : 1),
      outputType: 'VEC4',
      componentType: 5126,
      normalized: false,
      ...spec.raw
    },
    quantizationStep: spec.quantizationStep ?? 0,
    restRotation: spec.restRotation ?? [0, 0, 0, 1],
    isRoot: spec.isRoot ?? false
  };
}

/** Flattens quaternions into the reader's 4-floats-per-key layout. */
export function flatten(quats: readonly Quat[]): Float32Array {
  const out = new Float32Array(quats.length * 4);
  quats.forEach((q, k) => out.set(q as ArrayLike<number>, k * 4));
  return out;
}

/** The unit quaternion for a rotation of `angleDegrees` about `axis` (normalized here). */
export function axisAngle(
  axis: readonly [number, number, number],
  angleDegrees: number
): [number, number, number, number] {
  const length = Math.hypot(axis[0], axis[1], axis[2]);
  const half = (angleDegrees * Math.PI) / 360;
  const s = Math.sin(half) / length;
  return [axis[0] * s, axis[1] * s, axis[2] * s, Math.cos(half)];
}

/**
 * Keys turning steadily about `axis` by `degreesPerKey`, starting at `startDegrees`: the densely
 * baked, smooth motion most rules should stay quiet about.
 */
export function steadyTurn(
  axis: readonly [number, number, number],
  degreesPerKey: number,
  count: number,
  startDegrees = 0
): [number, number, number, number][] {
  return Array.from({ length: count }, (_, k) => axisAngle(axis, startDegrees + k * degreesPerKey));
}

/** A node as the reader describes it; identity transform unless stated. */
export function nodeFrom(spec: Partial<NodeFacts> & { nodePath: string }): NodeFacts {
  const worldMatrix = spec.worldMatrix ?? Float64Array.from([1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1]);
  return {
    nodeIndex: 0,
    rotation: null,
    worldDeterminant: 1,
    isSceneRoot: false,
    isRootJoint: false,
    isJoint: false,
    hasMesh: false,
    ...spec,
    worldMatrix
  };
}

/** Asset facts from nodes (indices assigned in order) and skins. */
export function factsFrom(nodes: NodeFacts[], skins: SkinFacts[] = []): AssetFacts {
  return { nodes: nodes.map((node, nodeIndex) => ({ ...node, nodeIndex })), skins };
}

/** A draft as the runner would file it: with its final severity. */
export type TestFinding = FindingDraft & { severity: Severity; rule: string };

/**
 * Runs one rule the way the lint runner does: skipped when the policy turns it off, findings
 * take the draft's severity when the rule set one, else the rule's effective severity.
 */
export function runRule(
  rule: Rule,
  input: { channels?: RotationChannel[]; facts?: AssetFacts; policy?: PolicyInput | Policy }
): TestFinding[] {
  const policy = parsePolicy(input.policy ?? {});
  const severity = severityFor(policy, rule.id, rule.defaultSeverity);
  if (severity === 'off') return [];
  const findings: TestFinding[] = [];
  const context: RuleContext = {
    asset: 'props/lantern.glb',
    policy,
    severity,
    emit(draft) {
      findings.push({ ...draft, severity: draft.severity ?? severity, rule: rule.id });
    }
  };
  const channels = input.channels ?? [];
  if (rule.scope === 'channel') {
    for (const channel of channels) (rule as ChannelRule).check(channel, context);
  } else {
    (rule as AssetRule).check(input.facts ?? { nodes: [], skins: [] }, channels, context);
  }
  return findings;
}

/** Shorthand: runs a rule on channels only. */
export function runOnChannels(rule: Rule, channels: RotationChannel[], policy?: PolicyInput): TestFinding[] {
  return runRule(rule, { channels, policy });
}

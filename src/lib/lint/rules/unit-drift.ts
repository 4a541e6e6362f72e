/**
 * unit-drift: rotation keys and node rest rotations whose length strays from 1.
 * A quaternion of length 1+e applied as q·v·q* rotates v and also scales it by (1+e)², so
 * |length − 1| > tolerances.unitWarning (1e-3, a 0.2% scale) is a warning and above
 * tolerances.unitError (1e-2, about 2%, visible on a long limb) an error. Quantized keys cannot
 * be more exact than their encoding, so both tolerances grow to at least two encoding steps.
 * Consecutive drifting keys make one finding, graded by its worst key (the policy's override wins,
 * see graded-severity.ts). Keys that are not rotations at all are left to not-a-rotation.
 * Source: glTF 2.0 §3.5.3 ("rotation is a unit quaternion") and §3.11; Hamilton product algebra.
 */
import type { Severity } from '../finding';
import type { RotationChannel } from '../read/rotation-channel';
import type { AssetFacts } from '../read/node-facts';
import type { AssetRule, RuleContext } from './rule';
import type { ChannelDigest } from './digest/channel-digest';
import { MARK, forEachMarkedKey, getChannelDigest } from './digest/channel-digest';
import { channelDraft, describePlace } from './channel-draft';
import { formatNumber, formatQuaternion } from './format-number';
import { gradedSeverity } from './graded-severity';
import { KeyRangeCollector } from './key-ranges';
import { lengthSquaredAt } from '../math/flat-keys';

const HINT =
  'Run `orientry fix <file> -o <fixed file> --rules unit-drift` (renormalize) to scale each quaternion back to ' +
  'length 1, or normalize rotations in the exporter before it writes them.';

export const unitDrift: AssetRule = {
  id: 'unit-drift',
  defaultSeverity: 'warning',
  scope: 'asset',
  title: 'Rotation quaternions are not unit length',
  rationale:
    'glTF stores rotations as unit quaternions. A quaternion of length 1+e applied as q·v·q* also scales what it ' +
    'rotates by (1+e)², so players that do not renormalize stretch or shrink the node, and renormalizing ones ' +
    'disagree with them. The warning starts at 1e-3 (a 0.2% scale), the error at 1e-2 (about 2%, visible).',
  source: 'glTF 2.0 §3.5.3 (rotation is a unit quaternion), §3.11; quaternion rotation q·v·q*',
  check: checkUnitDrift
};

interface Tolerances {
  warning: number;
  error: number;
}

function checkUnitDrift(facts: AssetFacts, channels: readonly RotationChannel[], context: RuleContext): void {
  const { unitWarning, unitError, zeroLength } = context.policy.tolerances;
  for (const channel of channels) {
    const digest = getChannelDigest(channel, context.policy);
    if ((digest.flags & MARK.unitDrift) === 0) continue;
    // Two steps: rounding each component to its step already moves the length by up to one step.
    const floor = 2 * channel.quantizationStep;
    const tolerances = { warning: Math.max(unitWarning, floor), error: Math.max(unitError, floor) };
    reportKeys(channel, digest, tolerances, context);
  }
  for (const node of facts.nodes) {
    const rotation = node.rotation;
    if (rotation === null) continue;
    const length = Math.hypot(rotation[0], rotation[1], rotation[2], rotation[3]);
    if (!Number.isFinite(length) || length < zeroLength) continue;
    const deviation = Math.abs(length - 1);
    if (deviation <= unitWarning) continue;
    context.emit({
      animation: null,
      channel: null,
      node: node.nodePath,
      keys: null,
      time: null,
      values: { length, deviation, scalePercent: scalePercent(length) },
      message:
        `The rest rotation of ${node.nodePath}, ${formatQuaternion(rotation)}, has length ${formatLength(length)}: ` +
        `${describeDeviation(length)}. Applied as q·v·q* it scales the node by ${formatNumber(scalePercent(length), 2)}% ` +
        'as well as rotating it, in every player that does not renormalize.',
      hint: HINT,
      target: 'rest',
      severity: gradedSeverity(context, 'unit-drift', natural(deviation, { warning: unitWarning, error: unitError }))
    });
  }
}

function reportKeys(
  channel: RotationChannel,
  digest: ChannelDigest,
  tolerances: Tolerances,
  context: RuleContext
): void {
  const values = channel.values;
  const collector = new KeyRangeCollector('keys', (range) => {
    const offset = range.worstIndex * 4;
    const length = Math.hypot(values[offset], values[offset + 1], values[offset + 2], values[offset + 3]);
    const step = channel.quantizationStep;
    const quantizedNote =
      step > 0
        ? ` The tolerance is ${formatNumber(tolerances.warning)} because this encoding's step is ${formatNumber(step)}.`
        : '';
    context.emit(
      channelDraft(channel, {
        first: range.first,
        last: range.last,
        values: {
          keys: range.flaggedCount,
          worstKey: range.worstIndex,
          length,
          deviation: range.worstScore,
          scalePercent: scalePercent(length),
          tolerance: tolerances.warning
        },
        message:
          `${describePlace(channel, range.first, range.last)}: ` +
          (range.flaggedCount === 1
            ? `key ${range.worstIndex} is not unit length: its length is ${formatLength(length)} `
            : `${range.flaggedCount} keys are not unit length; the worst, key ${range.worstIndex}, has length ${formatLength(length)} `) +
          `(${describeDeviation(length)}). Applied as q·v·q* it scales the node by ` +
          `${formatNumber(scalePercent(length), 2)}% as well as rotating it, in every player that does not ` +
          `renormalize.${quantizedNote}`,
        hint: HINT,
        severity: gradedSeverity(context, 'unit-drift', natural(range.worstScore, tolerances))
      })
    );
  });
  // Marked keys are finite, not (near) zero, and off length 1 by about the tolerance or more.
  forEachMarkedKey(digest, MARK.unitDrift, (k) => {
    const deviation = Math.abs(Math.sqrt(lengthSquaredAt(values, k * 4)) - 1);
    if (deviation > tolerances.warning) collector.add(k, k, deviation, k);
  });
  collector.finish();
}

function natural(deviation: number, tolerances: { warning: number; error: number }): Severity {
  return deviation > tolerances.error ? 'error' : 'warning';
}

/** How much q·v·q* scales v, in percent: (length² − 1)·100. */
function scalePercent(length: number): number {
  return (length * length - 1) * 100;
}

/** Enough digits to show the drift: 1.0021, 0.99987. */
function formatLength(length: number): string {
  const deviation = Math.abs(length - 1);
  const digits = deviation > 0 ? Math.min(9, Math.max(3, Math.ceil(-Math.log10(deviation)) + 1)) : 3;
  return length.toFixed(digits);
}

function describeDeviation(length: number): string {
  const percent = formatNumber(Math.abs(length - 1) * 100, 2);
  return length > 1 ? `${percent}% too long` : `${percent}% too short`;
}

/**
 * not-a-rotation: rotation keys, CUBICSPLINE tangents or node rest rotations that hold NaN or
 * infinite components, and quaternions so short (length < tolerances.zeroLength) that they name no
 * rotation at all. Normalizing them divides by (almost) zero, so players show NaN transforms:
 * the node vanishes or the whole skinned mesh explodes.
 * Source: glTF 2.0 §3.6.2.2 ("Values of NaN, +Infinity, and -Infinity MUST NOT be present");
 * §3.5.3 (`rotation` is a unit quaternion).
 */
import type { RotationChannel } from '../read/rotation-channel';
import type { AssetFacts } from '../read/node-facts';
import type { AssetRule, RuleContext } from './rule';
import type { ChannelDigest } from './digest/channel-digest';
import { MARK, forEachMarkedKey, getChannelDigest } from './digest/channel-digest';
import { channelDraft, describePlace } from './channel-draft';
import { formatNumber, formatQuaternion } from './format-number';
import { KeyRangeCollector } from './key-ranges';
import { lengthSquaredAt } from '../math/flat-keys';

const WHY =
  'Normalizing it divides by zero, so players compute NaN transforms: the node disappears or a skinned mesh tears apart.';

export const notARotation: AssetRule = {
  id: 'not-a-rotation',
  defaultSeverity: 'error',
  scope: 'asset',
  title: 'A rotation is NaN, infinite or of zero length',
  rationale:
    'A quaternion with NaN or infinite components, or with (almost) zero length, describes no rotation. Every ' +
    'player has to normalize it and gets NaN, which hides the node or wrecks the skinned mesh it drives.',
  source: 'glTF 2.0 §3.6.2.2 (no NaN or infinity in accessors); §3.5.3 (rotation is a unit quaternion)',
  check: checkNotARotation
};

function checkNotARotation(facts: AssetFacts, channels: readonly RotationChannel[], context: RuleContext): void {
  const zeroLength = context.policy.tolerances.zeroLength;
  for (const channel of channels) {
    const digest = getChannelDigest(channel, context.policy);
    if ((digest.flags & MARK.notARotation) !== 0) reportKeys(channel, digest, context);
    if ((digest.flags & MARK.tangent) !== 0) reportTangents(channel, digest, context);
  }
  for (const node of facts.nodes) {
    const rotation = node.rotation;
    if (rotation === null) continue;
    const length = Math.hypot(rotation[0], rotation[1], rotation[2], rotation[3]);
    if (Number.isFinite(length) && length >= zeroLength) continue;
    context.emit({
      animation: null,
      channel: null,
      node: node.nodePath,
      keys: null,
      time: null,
      values: { rotation: formatQuaternion(rotation), length: Number.isFinite(length) ? length : String(length) },
      message:
        `The rest rotation of ${node.nodePath} is ${formatQuaternion(rotation)}, ` +
        `${Number.isFinite(length) ? `length ${formatNumber(length)}` : 'not a finite number'}: no rotation at all. ${WHY}`,
      hint: 'Set the node rotation to a unit quaternion in the source scene (identity is (0, 0, 0, 1)) and re-export.',
      target: 'rest'
    });
  }
}

function reportKeys(channel: RotationChannel, digest: ChannelDigest, context: RuleContext): void {
  const values = channel.values;
  const collector = new KeyRangeCollector('keys', (range) => {
    const offset = range.worstIndex * 4;
    const length = Math.hypot(values[offset], values[offset + 1], values[offset + 2], values[offset + 3]);
    const what = Number.isFinite(length) ? `has length ${formatNumber(length)}` : 'is not a finite number';
    context.emit(
      channelDraft(channel, {
        first: range.first,
        last: range.last,
        values: {
          keys: range.flaggedCount,
          worstKey: range.worstIndex,
          quaternion: formatQuaternion(values, offset),
          length: Number.isFinite(length) ? length : String(length)
        },
        message:
          `${describePlace(channel, range.first, range.last)}: ${range.flaggedCount === 1 ? 'this key is' : `${range.flaggedCount} keys are`} ` +
          `no rotation; key ${range.worstIndex} is ${formatQuaternion(values, offset)} and ${what}. ${WHY}`,
        hint:
          'Re-export the clip; a NaN or zero key usually comes from a broken constraint or a divide by zero in a ' +
          'bake step. Replace the keys with the pose from the neighbouring keys if the source cannot be fixed.'
      })
    );
  });
  // Marked keys are exactly the NaN, infinite and (near) zero ones.
  forEachMarkedKey(digest, MARK.notARotation, (k) => {
    const lengthSquared = lengthSquaredAt(values, k * 4);
    // NaN and infinity score highest so the message shows the worst kind of key in the run.
    collector.add(k, k, lengthSquared < Infinity ? 1 - Math.sqrt(lengthSquared) : 2, k);
  });
  collector.finish();
}

function reportTangents(channel: RotationChannel, digest: ChannelDigest, context: RuleContext): void {
  const inTangents = channel.inTangents;
  const outTangents = channel.outTangents;
  if (inTangents === null || outTangents === null) return;
  const collector = new KeyRangeCollector('keys', (range) => {
    const offset = range.worstIndex * 4;
    context.emit(
      channelDraft(channel, {
        first: range.first,
        last: range.last,
        values: {
          keys: range.flaggedCount,
          inTangent: formatQuaternion(inTangents, offset),
          outTangent: formatQuaternion(outTangents, offset)
        },
        message:
          `${describePlace(channel, range.first, range.last)}: the CUBICSPLINE tangents are not finite; key ` +
          `${range.worstIndex} has in-tangent ${formatQuaternion(inTangents, offset)} and out-tangent ` +
          `${formatQuaternion(outTangents, offset)}. The spline through these keys evaluates to NaN, so the node ` +
          'disappears for the length of the segment.',
        hint: 'Re-export the clip with finite tangents, or export it as LINEAR.',
        target: 'rotation:tangent'
      })
    );
  });
  forEachMarkedKey(digest, MARK.tangent, (k) => collector.add(k, k, 1, k));
  collector.finish();
}

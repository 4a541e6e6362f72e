/**
 * gimbal-proximity: for engines that store rotation curves as Euler angles
 * (policy.engine.rotationStorage = `euler`), keys whose middle angle for policy.engine.eulerOrder
 * lies within gimbalMarginDegrees (5°) of ±90°. There the Euler decomposition loses an axis: the
 * outer two angles are no longer separate, tiny pose changes swing them by large amounts, and the
 * engine's Euler curves between keys take detours the quaternions never did.
 * The middle angle's sine comes straight from the quaternion (one rotation-matrix element), so the
 * check costs a few multiplies per key; orders and angles follow three.js `Euler` conventions.
 * Source: common practice (gimbal lock of Tait–Bryan angles); three.js Euler.setFromQuaternion.
 */
import type { RotationChannel } from '../read/rotation-channel';
import type { ChannelRule, RuleContext } from './rule';
import { middleAngleSine, middleAxisOf } from '../math/euler-from-quaternion';
import { channelDraft, describePlace } from './channel-draft';
import { formatDegrees } from './format-number';
import { KeyRangeCollector } from './key-ranges';

export const gimbalProximity: ChannelRule = {
  id: 'gimbal-proximity',
  defaultSeverity: 'warning',
  scope: 'channel',
  title: 'Keys sit close to gimbal lock for the engine\u2019s Euler order',
  rationale:
    'Engines that store rotation curves as Euler angles lose an axis when the middle angle reaches ±90°: the two ' +
    'outer angles merge, small pose changes swing them wildly and the Euler curves between keys take detours the ' +
    'original quaternions never took. Only checked when the policy says the engine stores Euler angles.',
  source: 'common practice (gimbal lock of Euler angles); three.js Euler order conventions',
  check: checkGimbalProximity
};

function checkGimbalProximity(channel: RotationChannel, context: RuleContext): void {
  const engine = context.policy.engine;
  if (engine.rotationStorage !== 'euler') return;
  const order = engine.eulerOrder;
  const marginDegrees = engine.gimbalMarginDegrees;
  // |middle| ≥ 90° − margin ⇔ |sin(middle)| ≥ cos(margin).
  const sineLimit = Math.cos((marginDegrees * Math.PI) / 180);
  const values = channel.values;
  const axis = middleAxisOf(order).toUpperCase();

  const collector = new KeyRangeCollector('keys', (range) => {
    const o = range.worstIndex * 4;
    const sine = middleAngleSine(values[o], values[o + 1], values[o + 2], values[o + 3], order);
    const middleDegrees = (Math.asin(Math.max(-1, Math.min(1, sine))) * 180) / Math.PI;
    context.emit(
      channelDraft(channel, {
        first: range.first,
        last: range.last,
        values: {
          keys: range.flaggedCount,
          worstKey: range.worstIndex,
          middleAngleDegrees: middleDegrees,
          order,
          marginDegrees
        },
        message:
          `${describePlace(channel, range.first, range.last)}: ${range.flaggedCount === 1 ? 'this key sits' : `${range.flaggedCount} keys sit`} ` +
          `within ${formatDegrees(marginDegrees)} of gimbal lock for ${order} Euler angles; at key ${range.worstIndex} ` +
          `the middle (${axis}) angle is ${formatDegrees(middleDegrees)}. An engine storing ${order} curves loses an ` +
          'axis here: the other two angles swing wildly and its curves between keys wander off the original motion.',
        hint:
          `Keep this channel as quaternions in the engine, pick an Euler order whose middle axis this joint does ` +
          `not turn about by 90°, or re-pose the joint away from ±90° about ${axis}.`
      })
    );
  });
  for (let k = 0, o = 0; k < channel.keyCount; k++, o += 4) {
    const magnitude = Math.abs(middleAngleSine(values[o], values[o + 1], values[o + 2], values[o + 3], order));
    if (magnitude >= sineLimit) collector.add(k, k, magnitude, k);
  }
  collector.finish();
}

/**
 * spin-spike: a segment whose angular speed is above maxSpeedDegreesPerSecond (1440°/s, four
 * turns a second) and also spinSpikeMedianFactor (8) times the channel's median speed. One
 * segment far faster than everything around it is the trace an Euler-to-quaternion bake leaves
 * when its Euler curves pass through gimbal lock: two angles flip by 180° in one frame and the
 * quaternion curve whips round to follow. The median test keeps genuinely fast clips (a spinning
 * wheel) quiet. STEP channels never interpolate and are skipped.
 *
 * Design notes. Speed is the slerp angle 2·acos(|q̂_k·q̂_k+1|) over the key interval. The channel
 * digest marks the few segments that can exceed the limit, and only those get an exact speed.
 * Computing every segment's speed to find the median (acos and a selection over 10,000 segments)
 * measured about 0.2 ms per channel, too slow for the rule pass budget when many channels hold a
 * spike. The rule first decides "median < fastest candidate / factor" by counting segments that
 * are certainly slower, from speed ≤ π·√(1 − |cos|)/Δt and 1 − |cos| ≤ 1 − cos² (no root, no acos);
 * when more than half are, every candidate passes the median test and the message states that
 * bound. Only when the count cannot decide does it compute the exact median.
 * Source: common practice (Euler bakes through gimbal lock); slerp angle per glTF 2.0 Appendix C.
 */
import type { RotationChannel } from '../read/rotation-channel';
import type { ChannelRule, RuleContext } from './rule';
import { MARK, forEachMarkedKey, getChannelDigest } from './digest/channel-digest';
import { channelDraft, describePlace } from './channel-draft';
import { formatDegrees, formatDegreesPerSecond, formatSeconds } from './format-number';
import { KeyRangeCollector } from './key-ranges';
import { keyAngleRadians } from '../math/key-angle';
import { isUsableKey } from '../math/flat-keys';

const DEGREES_PER_RADIAN = 180 / Math.PI;

/** Exact speeds for the rare exact-median path, reused across channels. */
let speeds = new Float64Array(1024);

export const spinSpike: ChannelRule = {
  id: 'spin-spike',
  defaultSeverity: 'warning',
  scope: 'channel',
  title: 'One segment spins far faster than the rest of the channel',
  rationale:
    'A single step between keys that turns much faster than the rest of the channel, and faster than any body ' +
    'part moves, is almost always an Euler bake passing through gimbal lock: two Euler angles flip by 180° in one ' +
    'frame and the baked quaternions whip round with them. It shows as a one-frame spin.',
  source: 'common practice (Euler bakes through gimbal lock); slerp angle per glTF 2.0 Appendix C',
  check: checkSpinSpike
};

/** What the rule knows about the channel's median speed (rad/s). */
interface MedianFact {
  value: number;
  /** True when `value` is only an upper bound. */
  isBound: boolean;
}

function checkSpinSpike(channel: RotationChannel, context: RuleContext): void {
  if (channel.interpolation === 'STEP') return;
  const digest = getChannelDigest(channel, context.policy);
  if ((digest.flags & MARK.spinSpike) === 0) return;
  const maxSpeed = context.policy.maxSpeedDegreesPerSecond / DEGREES_PER_RADIAN;
  const factor = context.policy.spinSpikeMedianFactor;

  const fast: { k: number; speed: number }[] = [];
  forEachMarkedKey(digest, MARK.spinSpike, (k) => {
    const speed = segmentSpeed(channel, k - 1);
    if (speed > maxSpeed) fast.push({ k: k - 1, speed });
  });
  if (fast.length === 0) return;

  const slowest = Math.min(...fast.map((segment) => segment.speed));
  const median = findMedian(channel, slowest / factor);
  const spikes = median.isBound ? fast : fast.filter((segment) => segment.speed > factor * median.value);
  if (spikes.length === 0) return;

  const times = channel.times;
  const collector = new KeyRangeCollector('segments', (range) => {
    const k = range.worstIndex;
    const duration = times[k + 1] - times[k];
    const speedDegrees = range.worstScore * DEGREES_PER_RADIAN;
    const medianDegrees = median.value * DEGREES_PER_RADIAN;
    const angleDegrees = speedDegrees * duration;
    context.emit(
      channelDraft(channel, {
        first: range.first,
        last: range.last,
        values: {
          segments: range.flaggedCount,
          worstKey: k,
          speedDegreesPerSecond: speedDegrees,
          [median.isBound ? 'medianBelowDegreesPerSecond' : 'medianDegreesPerSecond']: medianDegrees,
          angleDegrees,
          durationSeconds: duration
        },
        message:
          `${describePlace(channel, range.first, range.last)}: keys ${k}–${k + 1} turn ${formatDegrees(angleDegrees)} in ` +
          `${formatSeconds(duration)}, ${formatDegreesPerSecond(speedDegrees)}: above the ` +
          `${formatDegreesPerSecond(context.policy.maxSpeedDegreesPerSecond)} limit and more than ${factor}× the channel's ` +
          `median speed (${median.isBound ? 'below ' : ''}${formatDegreesPerSecond(medianDegrees)}). A one-step spin like this is ` +
          'the usual trace of an Euler bake passing through gimbal lock: two angles flip by 180° between frames and ' +
          'the quaternions whip round with them.',
        hint:
          'Re-bake from the source rig with quaternion rotation (or with Euler filtering that keeps angles ' +
          'continuous), then check the pose at this time in the source scene.'
      })
    );
  });
  for (const spike of spikes) collector.add(spike.k, spike.k + 1, spike.speed, spike.k);
  collector.finish();
}

/** Exact speed of segment k (keys k, k+1) in rad/s, or NaN when a key is unusable or Δt ≤ 0. */
function segmentSpeed(channel: RotationChannel, k: number): number {
  const duration = channel.times[k + 1] - channel.times[k];
  if (!(duration > 0)) return NaN;
  return keyAngleRadians(channel.values, k * 4, channel.values, k * 4 + 4) / duration;
}

/**
 * The median speed over the channel's usable segments, or an upper bound on it when more than
 * half of them are certainly slower than `threshold` (which is all the caller needs).
 */
function findMedian(channel: RotationChannel, threshold: number): MedianFact {
  const { values, times } = channel;
  const segmentCount = Math.max(0, channel.keyCount - 1);
  let usable = 0;
  let surelySlower = 0;
  // At most segmentCount segments are usable, so this many certainly slower ones settle it early.
  const enough = Math.floor(segmentCount / 2) + 1;
  const thresholdSquared = threshold * threshold;
  const limit = thresholdSquared / (Math.PI * Math.PI);
  let x0 = values[0];
  let y0 = values[1];
  let z0 = values[2];
  let w0 = values[3];
  let lengthSquared0 = x0 * x0 + y0 * y0 + z0 * z0 + w0 * w0;
  for (let k = 0, o = 4; k < segmentCount; k++, o += 4) {
    const x = values[o];
    const y = values[o + 1];
    const z = values[o + 2];
    const w = values[o + 3];
    const lengthSquared = x * x + y * y + z * z + w * w;
    const duration = times[k + 1] - times[k];
    const lengthProduct = lengthSquared0 * lengthSquared;
    const dot = x0 * x + y0 * y + z0 * z + w0 * w;
    x0 = x;
    y0 = y;
    z0 = z;
    w0 = w;
    lengthSquared0 = lengthSquared;
    if (!(duration > 0) || !(lengthProduct > 0 && lengthProduct < Infinity)) continue;
    usable++;
    // speed² ≤ π²(1 − |cos|)/Δt² ≤ π²(1 − cos²)/Δt² = π²(|a|²|b|² − dot²)/(|a|²|b|²·Δt²).
    if (lengthProduct - dot * dot < limit * duration * duration * lengthProduct && ++surelySlower >= enough) break;
  }
  // With ⌊n/2⌋ + 1 values below the threshold, both middle values are below it.
  if (surelySlower >= Math.floor(usable / 2) + 1) return { value: threshold, isBound: true };
  return { value: exactMedian(channel, segmentCount), isBound: false };
}

function exactMedian(channel: RotationChannel, segmentCount: number): number {
  if (speeds.length < segmentCount) speeds = new Float64Array(segmentCount);
  let count = 0;
  for (let k = 0; k < segmentCount; k++) {
    if (!isUsableKey(channel.values, k * 4) || !isUsableKey(channel.values, k * 4 + 4)) continue;
    const speed = segmentSpeed(channel, k);
    if (speed === speed) speeds[count++] = speed;
  }
  if (count === 0) return 0;
  const sorted = speeds.subarray(0, count).sort();
  const middle = count >> 1;
  return count % 2 === 1 ? sorted[middle] : (sorted[middle - 1] + sorted[middle]) / 2;
}

/**
 * spline-dip: CUBICSPLINE segments whose curve, before the normalization the spec applies, sags
 * below splineMinLength (0.9) between keys. A sag means the curve cuts through the inside of the
 * 4D sphere; normalizing it back magnifies small tangent errors into visible wobbles, and at zero
 * length the rotation is undefined. Tangents that point away from the next key, keys in opposite
 * hemispheres and tangents scaled for the wrong key interval are the usual causes.
 * The curve is sampled at t = 1/8 … 7/8 of each segment, and only on segments the channel digest
 * could not rule out. It rules a segment out when the tangents pull the curve in by at most
 * r = (1 − L)/2, i.e. t_d·(4/27)·√(2(|b_k|² + |a_k+1|²)) ≤ r, and the chord between the keys stays
 * at least L + r from the origin: then |p(t)| ≥ (L + r) − r = L everywhere on the segment, because
 * h00 + h01 = 1 with both in [0, 1] keeps the value part on the chord, |h10|, |h11| ≤ 4/27, and a
 * chord between keys of length ≥ ρ at 4D angle θ keeps distance ρ·cos(θ/2) from the origin.
 * Source: glTF 2.0 Appendix C (cubic spline interpolation; result normalized for rotations).
 */
import type { RotationChannel } from '../read/rotation-channel';
import type { ChannelRule, RuleContext } from './rule';
import { MARK, forEachMarkedKey, getChannelDigest } from './digest/channel-digest';
import { channelDraft, describePlace } from './channel-draft';
import { formatNumber, formatSeconds } from './format-number';
import { hermiteInto } from '../math/hermite';
import { KeyRangeCollector } from './key-ranges';
import { isUsableKey } from '../math/flat-keys';

const SAMPLES = 8;
const point = new Float64Array(4);
/** The last sampled segment's shortest length and the t where it occurs. */
const sag = { length: Infinity, t: 0 };

export const splineDip: ChannelRule = {
  id: 'spline-dip',
  defaultSeverity: 'warning',
  scope: 'channel',
  title: 'A cubic segment sags towards the zero quaternion between keys',
  rationale:
    'glTF evaluates CUBICSPLINE rotations component-wise and normalizes the result. A curve that sags far inside ' +
    'the unit sphere turns small tangent errors into visible wobbles once normalized, and at zero length it is no ' +
    'rotation at all.',
  source: 'glTF 2.0 Appendix C (cubic spline interpolation)',
  check: checkSplineDip
};

function checkSplineDip(channel: RotationChannel, context: RuleContext): void {
  const inTangents = channel.inTangents;
  const outTangents = channel.outTangents;
  if (channel.interpolation !== 'CUBICSPLINE' || inTangents === null || outTangents === null) return;
  const minLength = context.policy.splineMinLength;
  const digest = getChannelDigest(channel, context.policy);
  if ((digest.flags & MARK.splineDip) === 0) return;
  const { values, times } = channel;

  const collector = new KeyRangeCollector('segments', (range) => {
    const k = range.worstIndex;
    const duration = times[k + 1] - times[k];
    sampleSegment(channel, inTangents, outTangents, k, duration);
    const sagTime = times[k] + sag.t * duration;
    context.emit(
      channelDraft(channel, {
        first: range.first,
        last: range.last,
        values: {
          segments: range.flaggedCount,
          worstKey: k,
          minLength: sag.length,
          atTimeSeconds: sagTime,
          limit: minLength
        },
        message:
          `${describePlace(channel, range.first, range.last)}: between keys ${k} and ${k + 1} the cubic curve sags to ` +
          `length ${formatNumber(sag.length, 3)} at ${formatSeconds(sagTime)} (limit ${formatNumber(minLength)}) before ` +
          'it is normalized. A curve that cuts this far inside the unit sphere turns small tangent errors into ' +
          'visible wobbles, and at zero length it is no rotation at all.',
        hint:
          'Re-export with tangents that follow the curve, or export the clip as LINEAR. If the keys also change ' +
          'hemisphere, unflip them first (`orientry fix <file> -o <fixed file> --rules hemisphere-jump`).'
      })
    );
  });

  // Marked segments are those a cheap bound could not clear (see digest/scan-cubic-keys.ts); sample them.
  forEachMarkedKey(digest, MARK.splineDip, (next) => {
    const k = next - 1;
    const duration = times[next] - times[k];
    if (!(duration > 0) || !isUsableKey(values, k * 4) || !isUsableKey(values, next * 4)) return;
    sampleSegment(channel, inTangents, outTangents, k, duration);
    if (sag.length < minLength) collector.add(k, next, -sag.length, k);
  });
  collector.finish();
}

/** Samples segment k at t = 1/8 … 7/8 and leaves the shortest un-normalized length in `sag`. */
function sampleSegment(
  channel: RotationChannel,
  inTangents: Float32Array,
  outTangents: Float32Array,
  k: number,
  duration: number
): void {
  sag.length = Infinity;
  sag.t = 0;
  for (let s = 1; s < SAMPLES; s++) {
    const t = s / SAMPLES;
    hermiteInto(point, channel.values, outTangents, inTangents, k * 4, k * 4 + 4, duration, t);
    const length = Math.hypot(point[0], point[1], point[2], point[3]);
    if (length < sag.length) {
      sag.length = length;
      sag.t = t;
    }
  }
}

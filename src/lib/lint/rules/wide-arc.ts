/**
 * wide-arc: consecutive keys more than wideArcDegrees (150° by default) apart, measured as the
 * rotation slerp turns through, 2·acos(|q̂_k·q̂_k+1|). Near 180° the short way round is ambiguous:
 * a tiny change in either key reverses the direction of the turn, and players, retargeters and
 * compressors can each pick a different side. STEP channels never interpolate and are skipped.
 * Source: glTF 2.0 Appendix C (slerp takes the short path); common practice for the 150° default.
 */
import type { RotationChannel } from '../read/rotation-channel';
import type { ChannelRule, RuleContext } from './rule';
import { MARK, forEachMarkedKey, getChannelDigest } from './digest/channel-digest';
import { channelDraft, describePlace } from './channel-draft';
import { formatDegrees, formatSeconds } from './format-number';
import { KeyRangeCollector } from './key-ranges';
import { dotAt, lengthSquaredAt } from '../math/flat-keys';

export const wideArc: ChannelRule = {
  id: 'wide-arc',
  defaultSeverity: 'warning',
  scope: 'channel',
  title: 'Consecutive keys are nearly half a turn apart',
  rationale:
    'Slerp turns the short way between two keys, and near 180° the short way is a coin toss: a rounding error ' +
    'in either key reverses the direction of the turn, so players, retargeters and compressors disagree.',
  source: 'glTF 2.0 Appendix C (slerp short path); common practice (150° default)',
  check: checkWideArc
};

function checkWideArc(channel: RotationChannel, context: RuleContext): void {
  if (channel.interpolation === 'STEP') return;
  const limitDegrees = context.policy.wideArcDegrees;
  // angle > limit ⇔ |cos(angle/2)| < cos(limit/2): compare cosines, no acos per segment.
  const cosineLimit = Math.cos((limitDegrees * Math.PI) / 360);
  const digest = getChannelDigest(channel, context.policy);
  if ((digest.flags & MARK.wideArc) === 0) return;
  const values = channel.values;
  const times = channel.times;
  const collector = new KeyRangeCollector('segments', (range) => {
    const k = range.worstIndex;
    const angleDegrees = (2 * Math.acos(Math.min(1, 1 - range.worstScore)) * 180) / Math.PI;
    const duration = times[k + 1] - times[k];
    context.emit(
      channelDraft(channel, {
        first: range.first,
        last: range.last,
        values: { segments: range.flaggedCount, worstKey: k, angleDegrees, limitDegrees },
        message:
          `${describePlace(channel, range.first, range.last)}: keys ${k} and ${k + 1} are ${formatDegrees(angleDegrees)} ` +
          `apart${Number.isFinite(duration) ? ` over ${formatSeconds(duration)}` : ''} (limit ${formatDegrees(limitDegrees)})` +
          `${range.flaggedCount > 1 ? `, one of ${range.flaggedCount} such steps` : ''}. Near half a turn the short ` +
          'way round is ambiguous: a rounding error in either key reverses the turn, and players, retargeters and ' +
          'compressors can each spin a different way.',
        hint: 'Key the motion more densely (bake more samples) so no step between keys turns more than the limit.'
      })
    );
  });
  forEachMarkedKey(digest, MARK.wideArc, (k) => {
    const a = (k - 1) * 4;
    const b = k * 4;
    const lengthProduct = Math.sqrt(lengthSquaredAt(values, a) * lengthSquaredAt(values, b));
    if (!(lengthProduct > 0 && lengthProduct < Infinity)) return;
    const dot = dotAt(values, a, b);
    const absCosine = Math.abs(dot) / lengthProduct;
    if (absCosine < cosineLimit) collector.add(k - 1, k, 1 - absCosine, k - 1);
  });
  collector.finish();
}

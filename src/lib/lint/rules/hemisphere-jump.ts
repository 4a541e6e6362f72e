/**
 * hemisphere-jump: consecutive keys whose 4D dot product is negative, i.e. q_k+1 sits closer to
 * −q_k than to q_k. q and −q are the same rotation, but the curve between them is not: glTF's slerp
 * takes the short path (Appendix C multiplies by the dot's sign), yet many curve editors,
 * compressors and engines blend components directly and swing the long way round. On LINEAR
 * channels that depends on the player, so it is a warning; the CUBICSPLINE formula has no sign
 * correction, so every player swings (and the curve dips towards zero length): an error.
 * STEP channels never interpolate, so they are skipped.
 * Source: glTF 2.0 Appendix C (spherical linear interpolation; cubic spline interpolation).
 */
import type { RotationChannel } from '../read/rotation-channel';
import type { ChannelRule, RuleContext } from './rule';
import { MARK, forEachMarkedKey, getChannelDigest } from './digest/channel-digest';
import { channelDraft, describePlace } from './channel-draft';
import { formatNumber } from './format-number';
import { gradedSeverity } from './graded-severity';
import { KeyRangeCollector } from './key-ranges';
import { dotAt, lengthSquaredAt } from '../math/flat-keys';

export const hemisphereJump: ChannelRule = {
  id: 'hemisphere-jump',
  defaultSeverity: 'warning',
  scope: 'channel',
  title: 'Consecutive keys sit in opposite hemispheres (q then −q)',
  rationale:
    'A key on the far side of the 4D sphere from the key before it is the same pose, but interpolation between ' +
    'the two is not: players that blend components swing the long way round, up to a full extra turn. glTF slerp ' +
    'corrects for it on LINEAR channels (warning, since many tools do not), the cubic spline never does (error).',
  source: 'glTF 2.0 Appendix C (slerp short path; cubic spline interpolation)',
  check: checkHemisphereJump
};

function checkHemisphereJump(channel: RotationChannel, context: RuleContext): void {
  if (channel.interpolation === 'STEP') return;
  const digest = getChannelDigest(channel, context.policy);
  if ((digest.flags & MARK.hemisphereJump) === 0) return;
  const isCubic = channel.interpolation === 'CUBICSPLINE';
  const values = channel.values;
  const severity = gradedSeverity(context, 'hemisphere-jump', isCubic ? 'error' : 'warning');
  const why = isCubic
    ? 'The cubic spline blends components with no sign correction, so every player swings the long way round ' +
      'between them and the curve sags towards zero length on the way.'
    : 'glTF slerp takes the short way, but curve editors, compressors and engines that blend components swing the ' +
      'long way round, up to a full extra turn.';
  const collector = new KeyRangeCollector('segments', (range) => {
    const k = range.worstIndex;
    context.emit(
      channelDraft(channel, {
        first: range.first,
        last: range.last,
        values: { flips: range.flaggedCount, worstKey: k, dot: -range.worstScore },
        message:
          `${describePlace(channel, range.first, range.last)}: ${range.flaggedCount === 1 ? 'one step changes' : `${range.flaggedCount} steps change`} ` +
          `hemisphere; key ${k + 1} lies closer to −key ${k} than to key ${k} (normalized dot ` +
          `${formatNumber(-range.worstScore, 4)}). Both are the same pose, but the curve between them is not. ${why}`,
        hint:
          'Run `orientry fix <file> -o <fixed file> --rules hemisphere-jump` (unflip hemispheres): it negates keys ' +
          '(and their tangents) so each key lies in the same hemisphere as the one before, which changes no pose.',
        severity
      })
    );
  });
  // Marked pairs have a negative dot; the score is the normalized one.
  forEachMarkedKey(digest, MARK.hemisphereJump, (k) => {
    const a = (k - 1) * 4;
    const b = k * 4;
    const dot = dotAt(values, a, b);
    collector.add(k - 1, k, -dot / Math.sqrt(lengthSquaredAt(values, a) * lengthSquaredAt(values, b)), k - 1);
  });
  collector.finish();
}

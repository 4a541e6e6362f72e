/**
 * antipodal-keys: a key that is (within tolerances.antipodal) the exact negation of the key
 * before it. It is the same pose, but the segment between them is degenerate: the CUBICSPLINE
 * curve passes through the zero quaternion (which no normalization can rescue), and slerp's angle
 * is undefined there (sin a = 0), so players divide by zero or snap. Appendix C tells exporters to
 * avoid v_k = −v_k+1. Warning on LINEAR (spec slerp copes through its sign term; naive blends do
 * not), error on CUBICSPLINE; STEP channels never interpolate and are skipped.
 * An antipodal pair is also the extreme case of hemisphere-jump; both rules report it.
 * Source: glTF 2.0 Appendix C (cubic spline: "ensuring that v_k != −v_k+1"; slerp).
 */
import type { RotationChannel } from '../read/rotation-channel';
import type { ChannelRule, RuleContext } from './rule';
import { MARK, forEachMarkedKey, getChannelDigest } from './digest/channel-digest';
import { channelDraft, describePlace } from './channel-draft';
import { formatNumber } from './format-number';
import { gradedSeverity } from './graded-severity';
import { KeyRangeCollector } from './key-ranges';
import { dotAt, lengthSquaredAt } from '../math/flat-keys';

export const antipodalKeys: ChannelRule = {
  id: 'antipodal-keys',
  defaultSeverity: 'warning',
  scope: 'channel',
  title: 'A key is the exact negation of the key before it',
  rationale:
    'q and −q are the same pose, but the segment between them is degenerate: the cubic spline passes through the ' +
    'zero quaternion, which is no rotation, and slerp divides by sin 0. glTF asks exporters to avoid it.',
  source: 'glTF 2.0 Appendix C (cubic spline: avoid v_k = −v_k+1; slerp)',
  check: checkAntipodalKeys
};

function checkAntipodalKeys(channel: RotationChannel, context: RuleContext): void {
  if (channel.interpolation === 'STEP') return;
  const tolerance = context.policy.tolerances.antipodal;
  const toleranceSquared = tolerance * tolerance;
  const digest = getChannelDigest(channel, context.policy);
  if ((digest.flags & MARK.antipodalKeys) === 0) return;
  const isCubic = channel.interpolation === 'CUBICSPLINE';
  const values = channel.values;
  const severity = gradedSeverity(context, 'antipodal-keys', isCubic ? 'error' : 'warning');
  const why = isCubic
    ? 'The cubic spline between them passes through the zero quaternion, which no normalization can turn into a ' +
      'rotation: players show NaN or snap.'
    : 'Slerp between them has an undefined angle (sin 0 = 0): players that follow the formula literally divide by ' +
      'zero, and those that blend components pass through the zero quaternion.';
  const collector = new KeyRangeCollector('segments', (range) => {
    const k = range.worstIndex;
    context.emit(
      channelDraft(channel, {
        first: range.first,
        last: range.last,
        values: { pairs: range.flaggedCount, worstKey: k, distance: -range.worstScore, tolerance },
        message:
          `${describePlace(channel, range.first, range.last)}: key ${k + 1} is key ${k} negated (distance ` +
          `${formatNumber(-range.worstScore, 2)} from −q${k}, tolerance ${formatNumber(tolerance)})` +
          `${range.flaggedCount > 1 ? `, and ${range.flaggedCount - 1} more such pairs follow` : ''}. ${why}`,
        hint:
          'Run `orientry fix <file> -o <fixed file> --rules antipodal-keys` (break antipodal keys), or negate the ' +
          'later key (and the keys after it) so both keys are written with the same sign.',
        severity
      })
    );
  });
  forEachMarkedKey(digest, MARK.antipodalKeys, (k) => {
    const a = (k - 1) * 4;
    const b = k * 4;
    const lengthA = lengthSquaredAt(values, a);
    const lengthB = lengthSquaredAt(values, b);
    // Keys that are no rotation at all belong to not-a-rotation.
    if (!(lengthA > 0 && lengthA < Infinity && lengthB > 0 && lengthB < Infinity)) return;
    const dot = dotAt(values, a, b);
    // |q_k + q_k+1|² = |q_k|² + |q_k+1|² + 2·dot.
    const distanceSquared = lengthA + lengthB + 2 * dot;
    if (distanceSquared <= toleranceSquared) collector.add(k - 1, k, -Math.sqrt(Math.max(0, distanceSquared)), k - 1);
  });
  collector.finish();
}

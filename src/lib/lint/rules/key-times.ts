/**
 * key-times: a sampler's key times must be usable before any value can be judged. Times must be
 * finite, start at or after zero and strictly increase, and the output must hold one value per key
 * (three for CUBICSPLINE: in-tangent, value, out-tangent), with at least two keys for CUBICSPLINE.
 * Source: glTF 2.0 §3.11 (animation sampler input/output) and the animation.sampler schema
 * ("time[0] >= 0.0, and strictly increasing values"); Appendix C (cubic spline needs 2 keyframes).
 */
import type { RotationChannel } from '../read/rotation-channel';
import type { ChannelRule, RuleContext } from './rule';
import { MARK, getChannelDigest } from './digest/channel-digest';
import { channelDraft, describeChannel, describeKeys, wholeChannelDraft } from './channel-draft';
import { formatNumber, formatSeconds } from './format-number';
import { KeyRangeCollector } from './key-ranges';

const HINT_TIMES =
  'Re-export the clip from the source tool; if a pipeline step rewrote the times (resampling, trimming, merging clips), ' +
  'check that step. Key times must be finite seconds, start at 0 or later and increase from key to key.';

export const keyTimes: ChannelRule = {
  id: 'key-times',
  defaultSeverity: 'error',
  scope: 'channel',
  title: 'Key times are broken or do not match the key values',
  rationale:
    'Players find the keys around the current time by searching the sampler input, so times that repeat, run ' +
    'backwards, are negative or are not numbers make them show the wrong keys or skip parts of the clip, and an ' +
    'output with more or fewer values than there are times leaves each player to guess which keys belong together.',
  source: 'glTF 2.0 §3.11 Animations (sampler input and output); animation.sampler schema; Appendix C',
  check: checkKeyTimes
};

function checkKeyTimes(channel: RotationChannel, context: RuleContext): void {
  const { inputCount, outputCount } = channel.raw;
  const isCubic = channel.interpolation === 'CUBICSPLINE';
  const perKey = isCubic ? 3 : 1;
  const place = describeChannel(channel);

  if (outputCount !== inputCount * perKey) {
    context.emit(
      wholeChannelDraft(channel, {
        values: { inputCount, outputCount, expectedOutputCount: inputCount * perKey },
        message:
          `${place} has ${inputCount} key times but ${outputCount} output values; ${channel.interpolation} needs ` +
          `${isCubic ? 'three values per key (in-tangent, value, out-tangent)' : 'one value per key'}, so ` +
          `${inputCount * perKey}. Players disagree about which values go with which times, so the clip plays ` +
          'differently from one to the next.',
        hint: 'Re-export the clip so the sampler input and output describe the same keys.',
        target: 'rotation:count'
      })
    );
  }
  if (isCubic && inputCount < 2) {
    context.emit(
      wholeChannelDraft(channel, {
        values: { inputCount },
        message:
          `${place} is CUBICSPLINE with ${inputCount} key${inputCount === 1 ? '' : 's'}; a cubic spline needs at ` +
          'least two keys to have a segment at all (glTF 2.0 Appendix C).',
        hint: 'Use STEP for a single held pose, or export at least two keys.',
        target: 'rotation:cubic-keys'
      })
    );
  }

  const digest = getChannelDigest(channel, context.policy);
  // The digest covers the first keyCount times; any extra stored times still need a look.
  if ((digest.flags & MARK.keyTimes) === 0 && channel.times.length === channel.keyCount) return;
  reportTimeProblems(channel, context);
}

function reportTimeProblems(channel: RotationChannel, context: RuleContext): void {
  const times = channel.times;
  const place = describeChannel(channel);
  const nonFinite = new KeyRangeCollector('keys', (range) => {
    context.emit(
      channelDraft(channel, {
        first: range.first,
        last: range.last,
        values: { times: range.flaggedCount, worstTime: String(times[range.worstIndex]) },
        message:
          `${place}: ${describeKeys(channel, range.first, range.last)} ${range.flaggedCount === 1 ? 'has' : 'have'} ` +
          `time ${formatNumber(times[range.worstIndex])}${foldedNote(range.foldedRanges)}. A key time must be a ` +
          'finite number of seconds; players cannot place this key on the timeline.',
        hint: HINT_TIMES
      })
    );
  });
  const negative = new KeyRangeCollector('keys', (range) => {
    context.emit(
      channelDraft(channel, {
        first: range.first,
        last: range.last,
        values: { times: range.flaggedCount, earliestTime: times[range.worstIndex] },
        message:
          `${place}: ${describeKeys(channel, range.first, range.last)} start before zero (earliest ` +
          `${formatSeconds(times[range.worstIndex])})${foldedNote(range.foldedRanges)}. Animation time starts at 0, ` +
          'so players clamp or drop these keys and the start of the clip changes.',
        hint: HINT_TIMES
      })
    );
  });
  const order = new KeyRangeCollector('segments', (range) => {
    const k = range.worstIndex;
    context.emit(
      channelDraft(channel, {
        first: range.first,
        last: range.last,
        values: { pairs: range.flaggedCount, timeBefore: times[k], timeAfter: times[k + 1] },
        message:
          `${place}: key times do not increase across ${describeKeys(channel, range.first, range.last)}; the worst ` +
          `pair, keys ${k}–${k + 1}, goes from ${formatSeconds(times[k])} to ${formatSeconds(times[k + 1])}` +
          `${foldedNote(range.foldedRanges)}. Each key must come strictly later than the one before, or players ` +
          'searching the timeline land on the wrong keys.',
        hint: HINT_TIMES
      })
    );
  });

  let previous = NaN;
  for (let k = 0; k < times.length; k++) {
    const time = times[k];
    if (!Number.isFinite(time)) {
      nonFinite.add(k, k, 1, k);
    } else {
      if (time < 0) negative.add(k, k, -time, k);
      if (k > 0 && Number.isFinite(previous) && !(time > previous)) order.add(k - 1, k, previous - time, k - 1);
    }
    previous = time;
  }
  nonFinite.finish();
  negative.finish();
  order.finish();
}

function foldedNote(foldedRanges: number): string {
  return foldedRanges > 0 ? ` (this finding stands for ${foldedRanges} separate runs)` : '';
}

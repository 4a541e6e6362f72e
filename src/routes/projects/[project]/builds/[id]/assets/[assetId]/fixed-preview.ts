/**
 * The "after fix" curve of a plotted channel: the stored keys run through the lint library's
 * `previewFixedChannel` in the browser, with the key fixes the download would apply under the
 * build's policy (renormalize, unflip hemispheres, break antipodal keys).
 */
import { previewFixedChannel } from '$lib/lint/fix/preview-channel';
import { severityFor, type Policy } from '$lib/lint/policy';
import type { RotationChannel } from '$lib/lint/read/rotation-channel';
import type { RuleId } from '$lib/lint/rule-ids';
import { RULES } from '$lib/lint/rules/index';
import type { ChannelSeries } from '$lib/server/builds/get-asset-channels';
import type { ChannelOutline } from '$lib/server/dashboard/get-asset-outline';
import { keySeriesOf, type KeySeries } from './channel-math';

/** Rules whose fixes change keys one channel at a time (the basis fixes need the whole node tree). */
const KEY_FIX_RULES: readonly RuleId[] = ['unit-drift', 'hemisphere-jump', 'antipodal-keys'];

/** The key-fix rules the policy has not turned off: the ones `fixDocument` would apply by default. */
export function keyFixRulesOf(policy: Policy): RuleId[] {
  return KEY_FIX_RULES.filter((rule) => {
    const defaultSeverity = RULES.find((candidate) => candidate.id === rule)?.defaultSeverity ?? 'warning';
    return severityFor(policy, rule, defaultSeverity) !== 'off';
  });
}

/**
 * The channel's keys as the fixed file would store them. CUBICSPLINE tangents are not part of the
 * plotted series, so the preview fixes the key values only; the download fixes tangents too.
 */
export function previewFixedSeries(outline: ChannelOutline, series: ChannelSeries, policy: Policy): KeySeries {
  const keyCount = series.times.length;
  const values = new Float32Array(keyCount * 4);
  for (let key = 0; key < keyCount; key++) {
    values.set([series.x[key], series.y[key], series.z[key], series.w[key]], key * 4);
  }
  const channel: RotationChannel = {
    animation: outline.animation,
    animationIndex: outline.animationIndex,
    channelIndex: outline.channelIndex,
    nodePath: outline.nodePath,
    nodeIndex: outline.nodeIndex,
    interpolation: outline.interpolation,
    times: Float32Array.from(series.times),
    values,
    inTangents: null,
    outTangents: null,
    keyCount,
    raw: outline.raw,
    quantizationStep: outline.quantizationStep,
    restRotation: outline.restRotation,
    isRoot: outline.isRoot
  };
  const fixed = previewFixedChannel(channel, keyFixRulesOf(policy), policy);
  return keySeriesOf(series.times, fixed.values, keyCount);
}

/**
 * The "after fix" curve of one rotation channel, for the dashboard: the same key fixes the
 * transforms apply (renormalize, unflip hemispheres, break antipodal keys), run on a channel's
 * typed arrays with no Document, so the browser can draw before and after side by side.
 */
import { defaultPolicy, type Policy } from '../policy';
import type { RotationChannel } from '../read/rotation-channel';
import type { RuleId } from '../rule-ids';
import { createKeyCurve, type KeyCurve } from './key-curve';
import { decodeComponent, encodeComponent } from './normalized-int';
import { renormalizeKeys } from './renormalize-keys';
import { alignAntipodalKeys, unflipKeys } from './unflip-keys';

/**
 * A copy of `channel` with its keys (and tangents) as the fixes for `rules` would store them, under
 * the policy's tolerances. unit-drift, hemisphere-jump and antipodal-keys have key fixes; other rule
 * ids are ignored (the basis fixes need the node hierarchy). Quantized channels show the re-encoded
 * values, exactly as the fixed file would decode. The input channel is not modified.
 *
 * @example previewFixedChannel(channel, ['hemisphere-jump']).values // keys with consistent signs
 */
export function previewFixedChannel(
  channel: RotationChannel,
  rules: readonly RuleId[],
  policy: Policy = defaultPolicy()
): RotationChannel {
  const curve = createKeyCurve(channel.keyCount, channel.values, channel.inTangents, channel.outTangents);
  const { tolerances } = policy;
  if (rules.includes('unit-drift')) {
    const unitTolerance = Math.max(tolerances.unitWarning, 2 * channel.quantizationStep);
    renormalizeKeys(curve, { unitTolerance, zeroLength: tolerances.zeroLength });
  }
  if (channel.interpolation !== 'STEP') {
    if (rules.includes('hemisphere-jump')) unflipKeys(curve);
    if (rules.includes('antipodal-keys')) alignAntipodalKeys(curve, tolerances.antipodal);
  }
  if (channel.raw.normalized && channel.quantizationStep > 0) requantize(curve, channel.raw.componentType);
  return {
    ...channel,
    values: Float32Array.from(curve.values),
    inTangents: curve.inTangents ? Float32Array.from(curve.inTangents) : null,
    outTangents: curve.outTangents ? Float32Array.from(curve.outTangents) : null
  };
}

/** Changed keys through glTF 2.0 §3.11 encode and decode, as the written file would hold them. */
function requantize(curve: KeyCurve, componentType: number): void {
  for (let keyIndex = 0; keyIndex < curve.keyCount; keyIndex++) {
    if (!curve.changedKeys[keyIndex]) continue;
    for (const array of [curve.values, curve.inTangents, curve.outTangents]) {
      if (!array) continue;
      for (let index = keyIndex * 4; index < keyIndex * 4 + 4; index++)
        array[index] = decodeComponent(encodeComponent(array[index], componentType, true), componentType, true);
    }
  }
}

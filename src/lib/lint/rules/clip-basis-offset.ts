/**
 * clip-basis-offset: a root node's or root joint's rotation channel whose every key differs from
 * the node's rest rotation by the same quarter or half turn about X, Y or Z (within
 * convention.clipOffsetToleranceDegrees). The clip was authored in another basis than the rig: it
 * carries a basis conversion in its keys that the rest pose does not (or the other way round), so
 * it plays turned against the bind pose, and blending or retargeting it with clips that lack the
 * offset tips the character over.
 * The offset is looked for on the parent side (key = turn·rest) and then the local side
 * (key = rest·turn); with an identity rest both are the same.
 * Source: glTF 2.0 §3.4 (coordinate system); common practice (clips exported with other axis settings).
 */
import type { RotationChannel } from '../read/rotation-channel';
import type { AssetFacts } from '../read/node-facts';
import type { AssetRule, RuleContext } from './rule';
import { findPrincipalTurn, type PrincipalTurn } from '../math/principal-turn';
import { multiplyQuat } from '../math/quat-multiply';
import { describeChannel } from './channel-draft';
import { formatDegrees } from './format-number';
import { describeTurn, describeTurnCause } from './describe-turn';

type Side = 'parent' | 'local';

const offset = new Float64Array(4);

export const clipBasisOffset: AssetRule = {
  id: 'clip-basis-offset',
  defaultSeverity: 'warning',
  scope: 'asset',
  title: 'A root clip is turned a quarter or half turn away from the rest pose',
  rationale:
    'When every key of a root channel sits the same quarter or half turn away from the rest rotation, the clip ' +
    'was exported with other axis settings than the rig. It plays turned against the bind pose, and blending or ' +
    'retargeting it together with clips that lack the offset tips the character over.',
  source: 'glTF 2.0 §3.4 (coordinate system); common practice (clips exported with other axis settings)',
  check: checkClipBasisOffset
};

function checkClipBasisOffset(_facts: AssetFacts, channels: readonly RotationChannel[], context: RuleContext): void {
  const toleranceDegrees = context.policy.convention.clipOffsetToleranceDegrees;
  for (const channel of channels) {
    if (!channel.isRoot || channel.keyCount === 0) continue;
    const [rx, ry, rz, rw] = channel.restRotation;
    const restLength = Math.hypot(rx, ry, rz, rw);
    if (!(restLength > 0) || !Number.isFinite(restLength)) continue;
    for (const side of ['parent', 'local'] as const) {
      const found = findCommonTurn(channel, side, toleranceDegrees);
      if (found === null) continue;
      report(channel, side, found.turn, found.worstDegrees, context);
      break;
    }
  }
}

/** The principal turn every key is offset by on `side`, with the largest deviation; null when there is none. */
function findCommonTurn(
  channel: RotationChannel,
  side: Side,
  toleranceDegrees: number
): { turn: PrincipalTurn; worstDegrees: number } | null {
  offsetOfKey(channel, 0, side);
  const match = findPrincipalTurn(offset[0], offset[1], offset[2], offset[3], toleranceDegrees);
  if (match === null) return null;
  const [tx, ty, tz, tw] = match.turn.quaternion;
  // Within tolerance ⇔ |offset̂·turn| ≥ cos(tolerance/2): the rotation angle is twice the 4D angle.
  const cosineLimit = Math.cos((toleranceDegrees * Math.PI) / 360);
  let worstCosine = 1;
  for (let k = 0; k < channel.keyCount; k++) {
    offsetOfKey(channel, k, side);
    const length = Math.sqrt(
      offset[0] * offset[0] + offset[1] * offset[1] + offset[2] * offset[2] + offset[3] * offset[3]
    );
    const cosine = Math.abs(offset[0] * tx + offset[1] * ty + offset[2] * tz + offset[3] * tw) / length;
    if (!(cosine >= cosineLimit)) return null;
    if (cosine < worstCosine) worstCosine = cosine;
  }
  return { turn: match.turn, worstDegrees: (2 * Math.acos(Math.min(1, worstCosine)) * 180) / Math.PI };
}

/** Writes key k's offset from the rest rotation into `offset`: key·rest* (parent side) or rest*·key (local side). */
function offsetOfKey(channel: RotationChannel, k: number, side: Side): void {
  const v = channel.values;
  const o = k * 4;
  const [rx, ry, rz, rw] = channel.restRotation;
  if (side === 'parent') multiplyQuat(offset, v[o], v[o + 1], v[o + 2], v[o + 3], -rx, -ry, -rz, rw);
  else multiplyQuat(offset, -rx, -ry, -rz, rw, v[o], v[o + 1], v[o + 2], v[o + 3]);
}

function report(
  channel: RotationChannel,
  side: Side,
  turn: PrincipalTurn,
  worstDegrees: number,
  context: RuleContext
): void {
  const last = channel.keyCount - 1;
  const time = channel.times[0];
  const sideText = side === 'parent' ? 'applied above the rest rotation' : 'applied below the rest rotation';
  context.emit({
    animation: channel.animation,
    channel: channel.channelIndex,
    node: channel.nodePath,
    keys: [0, last],
    time: Number.isFinite(time) ? Math.round(time * 1e6) / 1e6 : null,
    values: {
      axis: turn.axis,
      angleDegrees: turn.angleDegrees,
      side,
      worstDeviationDegrees: worstDegrees,
      keys: channel.keyCount
    },
    message:
      `${describeChannel(channel)}: every one of its ${channel.keyCount} key${channel.keyCount === 1 ? '' : 's'} is the root's rest ` +
      `rotation turned ${describeTurn(turn)} (${sideText}, within ${formatDegrees(worstDegrees)}), which looks like ` +
      `${describeTurnCause(turn)}. The clip and the rig were exported with different axis settings, so the clip ` +
      'plays turned against the bind pose, and blending or retargeting it with clips that lack the offset tips ' +
      'the character over.',
    hint:
      'Export the clip with the same axis settings as the rig, or run `orientry fix <file> -o <fixed file> --rules ' +
      'clip-basis-offset`, which takes the turn out of the keys so the clip plays in the rig\u2019s orientation.',
    target: 'rotation:basis'
  });
}

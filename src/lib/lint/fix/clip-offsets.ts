/**
 * Finds root clips exported with other axis settings than their rig (clip-basis-offset): a root
 * rotation channel whose every key is the rest rotation turned by one quarter or half turn D, on the
 * parent side (key = D·rest) or the local side (key = rest·D). The edit takes D out of every key
 * (D⁻¹·key or key·D⁻¹), so the clip plays in the rig's orientation. Detection follows the rule:
 * the first key names the turn, every key must lie within the tolerance of it.
 */
import type { AnimationChannel, Document } from '@gltf-transform/core';
import { findPrincipalTurn } from '../math/principal-turn';
import { multiply, type Quat } from './basis-turn';
import { rotationMap } from './basis-key-maps';
import type { ChannelEdit } from './channel-edits';
import { listRootNodes } from './root-nodes';
import { readSamplerCurve } from './sampler-output';

/** Root rotation channels whose keys all sit one principal turn away from the rest rotation. */
export function findClipOffsets(document: Document, toleranceDegrees: number): ChannelEdit[] {
  const roots = new Set(listRootNodes(document));
  const edits: ChannelEdit[] = [];
  for (const animation of document.getRoot().listAnimations())
    for (const channel of animation.listChannels()) {
      const node = channel.getTargetNode();
      if (!node || !roots.has(node) || channel.getTargetPath() !== 'rotation') continue;
      const edit = findClipOffset(channel, node.getRotation(), toleranceDegrees);
      if (edit) edits.push(edit);
    }
  return edits;
}

/**
 * The offset turn common to every key on the parent side (key·rest*), then the local side
 * (rest*·key), as clip-basis-offset looks for it: the first key names the turn, every key must be
 * within tolerance of it.
 */
function findClipOffset(channel: AnimationChannel, rest: Quat, toleranceDegrees: number): ChannelEdit | null {
  const sampler = channel.getSampler();
  const curve = sampler ? readSamplerCurve(sampler) : null;
  if (!curve || curve.keyCount === 0 || !(Math.hypot(...rest) > 0)) return null;
  const restConjugate: Quat = [-rest[0], -rest[1], -rest[2], rest[3]];
  const cosineLimit = Math.cos((toleranceDegrees * Math.PI) / 360);
  for (const side of ['parent', 'local'] as const) {
    const offsetOf = (keyIndex: number) => {
      const key = curve.values.subarray(keyIndex * 4, keyIndex * 4 + 4);
      return side === 'parent' ? multiply(key, restConjugate) : multiply(restConjugate, key);
    };
    const first = offsetOf(0);
    const match = findPrincipalTurn(first[0], first[1], first[2], first[3], toleranceDegrees);
    if (!match) continue;
    const [tx, ty, tz, tw] = match.turn.quaternion;
    let isCommon = true;
    for (let keyIndex = 0; keyIndex < curve.keyCount && isCommon; keyIndex++) {
      const [x, y, z, w] = offsetOf(keyIndex);
      const cosine = Math.abs(x * tx + y * ty + z * tz + w * tw) / Math.hypot(x, y, z, w);
      isCommon = cosine >= cosineLimit;
    }
    if (!isCommon) continue;
    const inverse: Quat = [-tx, -ty, -tz, tw];
    const map =
      side === 'parent'
        ? rotationMap(`clip-parent:${match.turn.axis}${match.turn.angleDegrees}`, inverse, null)
        : rotationMap(`clip-local:${match.turn.axis}${match.turn.angleDegrees}`, null, inverse);
    return { channel, map };
  }
  return null;
}

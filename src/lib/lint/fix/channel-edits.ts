/**
 * Applies per-channel key maps (premultiply by a turn, rotate translations...) to animation
 * channels, for fixes whose change depends on the channel's target rather than on the data alone.
 *
 * Design notes. Channels may share a sampler, and samplers may share an output accessor. A sampler
 * whose channels all want the same map is edited once; a sampler shared with a channel that wants a
 * different map (or none) is cloned first, and only the channel that needs the change moves to the
 * clone. The new outputs then go through commitOutputEdits, which clones shared accessors the same
 * way. Nothing another channel reads is ever changed under it.
 */
import { AnimationChannel, Animation, type AnimationSampler, type Document } from '@gltf-transform/core';
import type { KeyCurve } from './key-curve';
import { isNormalizedIntType } from './normalized-int';
import { renormalizeKeys } from './renormalize-keys';
import {
  commitOutputEdits,
  encodeSamplerCurve,
  readSamplerCurve,
  type CommitCounts,
  type OutputEdit
} from './sampler-output';

/** Shorter than this is not-a-rotation's business (the policy default), so it is not rescaled. */
const QUANTIZED_ZERO_LENGTH = 1e-6;

/** A change to every key of a channel: maps values and tangents in place. */
export interface KeyMap {
  /** Equal ids mean equal maps: channels sharing a sampler with the same id share the edit. */
  id: string;
  /** Components per output element: 4 for rotation, 3 for translation and scale. */
  components: 3 | 4;
  /** Maps one key's 4-slot value or tangent in place (slots past `components` are unused). */
  apply(slot: Float64Array, offset: number): void;
}

export interface ChannelEdit {
  channel: AnimationChannel;
  map: KeyMap;
}

/** Applies the edits; returns the keys changed and what happened to the accessors. */
export function applyChannelEdits(
  document: Document,
  edits: readonly ChannelEdit[]
): CommitCounts & { keysChanged: number } {
  const mapBySampler = new Map<AnimationSampler, KeyMap>();
  const editByChannel = new Map(edits.map((edit) => [edit.channel, edit.map]));
  for (const edit of edits) {
    let sampler = edit.channel.getSampler();
    if (!sampler) continue;
    const users = sampler
      .listParents()
      .filter((parent): parent is AnimationChannel => parent instanceof AnimationChannel);
    const shareable = users.every((user) => editByChannel.get(user)?.id === edit.map.id);
    if (!shareable) {
      const animation = edit.channel.listParents().find((parent): parent is Animation => parent instanceof Animation);
      const clone = sampler.clone();
      animation?.addSampler(clone);
      edit.channel.setSampler(clone);
      sampler = clone;
    }
    mapBySampler.set(sampler, edit.map);
  }

  const outputEdits: OutputEdit[] = [];
  let keysChanged = 0;
  for (const [sampler, map] of mapBySampler) {
    const curve = readSamplerCurve(sampler, map.components);
    if (!curve || curve.keyCount === 0) continue;
    mapCurve(curve, map);
    // Quantized rotations are re-rounded anyway; rounding from length exactly 1 keeps them within one
    // step of unit length (unit-drift allows two), whatever drift within tolerance they had before.
    const output = sampler.getOutput();
    if (map.components === 4 && output && isNormalizedIntType(output.getComponentType(), output.getNormalized()))
      renormalizeKeys(curve, { unitTolerance: 0, zeroLength: QUANTIZED_ZERO_LENGTH });
    keysChanged += curve.keyCount;
    outputEdits.push({ sampler, array: encodeSamplerCurve(sampler, curve, map.components) });
  }
  return { ...commitOutputEdits(document, outputEdits), keysChanged };
}

function mapCurve(curve: KeyCurve, map: KeyMap): void {
  for (let keyIndex = 0; keyIndex < curve.keyCount; keyIndex++) {
    for (const array of [curve.values, curve.inTangents, curve.outTangents]) if (array) map.apply(array, keyIndex * 4);
    curve.changedKeys[keyIndex] = 1;
  }
}

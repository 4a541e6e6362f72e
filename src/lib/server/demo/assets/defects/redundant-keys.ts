import type { Document } from '@gltf-transform/core';
import { DemoAssetError } from '../demo-asset-error';
import { slerp } from '../quaternion';
import { assertKeyInRange, getKey, readRotationTrack, writeRotationTrack, type RotationTarget } from './rotation-track';

/** Options for {@link redundantKeys}. */
export interface RedundantKeysOptions extends RotationTarget {
  /** First key after which a redundant key is inserted. */
  fromKey: number;
  /** How many consecutive gaps get one (1 by default). */
  count?: number;
}

/**
 * Inserts a key halfway between keys k and k + 1 for `count` gaps from `fromKey`, holding exactly
 * the slerp midpoint (glTF 2.0 Appendix C), so the player already produces it: the key adds
 * bytes and nothing else. Bakes that sample at twice the needed rate look like this. LINEAR
 * channels only. Mutates and returns `document`.
 */
export function redundantKeys(document: Document, options: RedundantKeysOptions): Document {
  const count = options.count ?? 1;
  const track = readRotationTrack(document, options);
  if (track.interpolation !== 'LINEAR') {
    throw new DemoAssetError(
      'demo.unsupported-channel',
      `redundantKeys: "${options.animation}" / "${options.node}" is ${track.interpolation}; pick a LINEAR channel.`
    );
  }
  assertKeyInRange(track, options.fromKey, 0, count, 'redundantKeys');
  const times: number[] = [];
  const values: number[] = [];
  for (let keyIndex = 0; keyIndex < track.times.length; keyIndex++) {
    times.push(track.times[keyIndex]);
    values.push(...getKey(track, keyIndex));
    if (keyIndex >= options.fromKey && keyIndex < options.fromKey + count) {
      times.push((track.times[keyIndex] + track.times[keyIndex + 1]) / 2);
      values.push(...slerp(getKey(track, keyIndex), getKey(track, keyIndex + 1), 0.5));
    }
  }
  track.times = Float32Array.from(times);
  track.values = Float32Array.from(values);
  writeRotationTrack(document, track);
  return document;
}

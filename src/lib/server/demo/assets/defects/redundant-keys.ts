import type { Document } from '@gltf-transform/core';
import { DemoAssetError } from '../demo-asset-error';
import { slerp } from '../quaternion';
import { assertKeyInRange, getKey, readRotationTrack, writeRotationTrack, type RotationTarget } from './rotation-track';

/** Options for {@link redundantKeys}. */
export interface RedundantKeysOptions extends RotationTarget {
  /** The new keys go between this key and the next. */
  afterKey: number;
  /** How many keys to insert (5 by default: a run long enough to be worth removing). */
  count?: number;
}

/**
 * Inserts `count` evenly spaced keys between keys `afterKey` and `afterKey + 1`, each holding
 * exactly the slerp of those two keys at its time (glTF 2.0 Appendix C). Every inserted key is
 * then reproduced by interpolating its own neighbours, so the run adds bytes and changes nothing
 * on screen: what a bake at several times the needed rate leaves on a steady stretch. LINEAR
 * channels only. Mutates and returns `document`.
 * @throws DemoAssetError for a channel that is not LINEAR or a key without a successor.
 */
export function redundantKeys(document: Document, options: RedundantKeysOptions): Document {
  const count = options.count ?? 5;
  const track = readRotationTrack(document, options);
  if (track.interpolation !== 'LINEAR') {
    throw new DemoAssetError(
      'demo.unsupported-channel',
      `redundantKeys: "${options.animation}" / "${options.node}" is ${track.interpolation}; pick a LINEAR channel.`
    );
  }
  assertKeyInRange(track, options.afterKey, 0, 1, 'redundantKeys');
  const start = options.afterKey;
  const [startTime, endTime] = [track.times[start], track.times[start + 1]];
  const [startKey, endKey] = [getKey(track, start), getKey(track, start + 1)];
  const times = Array.from(track.times);
  const values = Array.from(track.values);
  const insertedTimes: number[] = [];
  const insertedValues: number[] = [];
  for (let step = 1; step <= count; step++) {
    const fraction = step / (count + 1);
    insertedTimes.push(startTime + (endTime - startTime) * fraction);
    insertedValues.push(...slerp(startKey, endKey, fraction));
  }
  times.splice(start + 1, 0, ...insertedTimes);
  values.splice((start + 1) * 4, 0, ...insertedValues);
  track.times = Float32Array.from(times);
  track.values = Float32Array.from(values);
  writeRotationTrack(document, track);
  return document;
}

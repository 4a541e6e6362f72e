import type { Document } from '@gltf-transform/core';
import { DemoAssetError } from '../demo-asset-error';
import { angleBetweenDegrees, dot } from '../quaternion';
import { assertKeyInRange, getKey, readRotationTrack, writeRotationTrack, type RotationTarget } from './rotation-track';

/** Options for {@link wideArc}. */
export interface WideArcOptions extends RotationTarget {
  /** Key the wide step starts from. */
  fromKey: number;
  /** Largest step to create, in degrees (170 by default: far above a 150° limit, short of 180°). */
  arcDegrees?: number;
}

/**
 * Deletes the keys after `fromKey` up to the last one still within `arcDegrees` of it, leaving
 * one step of nearly that angle. Near 180° the slerp path is fragile: a little noise flips which
 * way round it goes. Aggressive key reduction passes cause it. The step keeps a positive dot,
 * so only the arc is wrong, not the hemisphere. Mutates and returns `document`.
 * @throws DemoAssetError when the channel never turns that far after `fromKey`.
 */
export function wideArc(document: Document, options: WideArcOptions): Document {
  const arcDegrees = options.arcDegrees ?? 170;
  const track = readRotationTrack(document, options);
  assertKeyInRange(track, options.fromKey, 0, 2, 'wideArc');
  const start = getKey(track, options.fromKey);
  let endKey = options.fromKey + 1;
  while (endKey + 1 < track.times.length) {
    const next = getKey(track, endKey + 1);
    if (angleBetweenDegrees(start, next) > arcDegrees || dot(start, next) <= 0) break;
    endKey++;
  }
  if (endKey === track.times.length - 1 || endKey - options.fromKey < 2) {
    throw new DemoAssetError(
      'demo.unsupported-channel',
      `wideArc: "${options.animation}" / "${options.node}" does not turn ${arcDegrees}° after key ${options.fromKey}; pick a channel that spins.`
    );
  }
  const keep = (keyIndex: number) => keyIndex <= options.fromKey || keyIndex >= endKey;
  const keptKeys = Array.from(track.times.keys()).filter(keep);
  track.times = Float32Array.from(keptKeys, (keyIndex) => track.times[keyIndex]);
  const pick = (array: Float32Array) =>
    Float32Array.from(keptKeys.flatMap((keyIndex) => [...array.subarray(keyIndex * 4, keyIndex * 4 + 4)]));
  track.values = pick(track.values);
  if (track.inTangents && track.outTangents) {
    track.inTangents = pick(track.inTangents);
    track.outTangents = pick(track.outTangents);
  }
  writeRotationTrack(document, track);
  return document;
}

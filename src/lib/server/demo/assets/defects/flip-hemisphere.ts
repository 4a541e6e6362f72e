import type { Document } from '@gltf-transform/core';
import { assertKeyInRange, readRotationTrack, writeRotationTrack, type RotationTarget } from './rotation-track';

/** Options for {@link flipHemisphere}. */
export interface FlipHemisphereOptions extends RotationTarget {
  /** First negated key; the jump sits between `fromKey - 1` and `fromKey`. */
  fromKey: number;
}

/**
 * Negates every key from `fromKey` on: each key still means the same rotation (q and -q do),
 * but the pair (fromKey - 1, fromKey) now has a negative dot, so a player that slerps along the
 * stored arc spins the long way round. This is what an exporter that canonicalises each key on
 * its own (say, forcing w ≥ 0) produces. Tangents flip with their keys. Mutates and returns `document`.
 */
export function flipHemisphere(document: Document, options: FlipHemisphereOptions): Document {
  const track = readRotationTrack(document, options);
  assertKeyInRange(track, options.fromKey, 1, 0, 'flipHemisphere');
  for (const array of [track.values, track.inTangents, track.outTangents]) {
    if (!array) continue;
    for (let i = options.fromKey * 4; i < array.length; i++) array[i] = -array[i];
  }
  writeRotationTrack(document, track);
  return document;
}

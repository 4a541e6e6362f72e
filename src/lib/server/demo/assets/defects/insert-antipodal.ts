import type { Document } from '@gltf-transform/core';
import { assertKeyInRange, readRotationTrack, writeRotationTrack, type RotationTarget } from './rotation-track';

/** Options for {@link insertAntipodal}. */
export interface InsertAntipodalOptions extends RotationTarget {
  /** Key whose value is copied, negated, onto the key after it. */
  keyIndex: number;
}

/**
 * Overwrites key `keyIndex + 1` with `-key[keyIndex]` (tangents too): two consecutive keys for
 * the same rotation from opposite hemispheres, so slerp between them has no defined path and
 * players disagree on a full 360° spin or none. Retargeting tools that copy a hold key and
 * re-sign it leave exactly this. Mutates and returns `document`.
 */
export function insertAntipodal(document: Document, options: InsertAntipodalOptions): Document {
  const track = readRotationTrack(document, options);
  assertKeyInRange(track, options.keyIndex, 0, 1, 'insertAntipodal');
  for (const array of [track.values, track.inTangents, track.outTangents]) {
    if (!array) continue;
    for (let i = 0; i < 4; i++) array[(options.keyIndex + 1) * 4 + i] = -array[options.keyIndex * 4 + i];
  }
  writeRotationTrack(document, track);
  return document;
}

import type { Document } from '@gltf-transform/core';
import { assertKeyInRange, readRotationTrack, writeRotationTrack, type RotationTarget } from './rotation-track';

/** Options for {@link nanKey}. */
export interface NanKeyOptions extends RotationTarget {
  keyIndex: number;
}

/**
 * Sets every component of key `keyIndex` to NaN, what a bake leaves after normalising a zero
 * quaternion (0 / 0). No player can show it. Mutates and returns `document`.
 */
export function nanKey(document: Document, options: NanKeyOptions): Document {
  const track = readRotationTrack(document, options);
  assertKeyInRange(track, options.keyIndex, 0, 0, 'nanKey');
  track.values.fill(Number.NaN, options.keyIndex * 4, options.keyIndex * 4 + 4);
  writeRotationTrack(document, track);
  return document;
}

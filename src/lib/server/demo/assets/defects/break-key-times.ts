import type { Document } from '@gltf-transform/core';
import { assertKeyInRange, readRotationTrack, writeRotationTrack, type RotationTarget } from './rotation-track';

/** Options for {@link breakKeyTimes}. */
export interface BreakKeyTimesOptions extends RotationTarget {
  /** Key whose time is set back to its predecessor's. */
  keyIndex: number;
}

/**
 * Gives key `keyIndex` the same time as the key before it, so the sampler input is no longer
 * strictly increasing (glTF 2.0 §3.11 requires it to be). Exporters that round times to a
 * coarse frame grid produce this. Only this channel's time accessor changes. Mutates and returns `document`.
 */
export function breakKeyTimes(document: Document, options: BreakKeyTimesOptions): Document {
  const track = readRotationTrack(document, options);
  assertKeyInRange(track, options.keyIndex, 1, 0, 'breakKeyTimes');
  track.times[options.keyIndex] = track.times[options.keyIndex - 1];
  writeRotationTrack(document, track);
  return document;
}

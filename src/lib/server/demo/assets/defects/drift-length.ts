import type { Document } from '@gltf-transform/core';
import { assertKeyInRange, readRotationTrack, writeRotationTrack, type RotationTarget } from './rotation-track';

/** Options for {@link driftLength}. */
export interface DriftLengthOptions extends RotationTarget {
  /** Length the keys end up with: 1.003 gives a unit-drift warning, 1.02 an error under default tolerances. */
  factor: number;
  /** First key scaled (0 by default). */
  fromKey?: number;
  /** Last key scaled, inclusive (the last key by default). */
  toKey?: number;
}

/**
 * Scales rotation keys by `factor`, the drift an exporter leaves when it accumulates float error
 * and never renormalises. Tangents of a CUBICSPLINE channel are scaled alike, so only the
 * length changes, not the shape. Mutates and returns `document`.
 */
export function driftLength(document: Document, options: DriftLengthOptions): Document {
  const track = readRotationTrack(document, options);
  const fromKey = options.fromKey ?? 0;
  const toKey = options.toKey ?? track.times.length - 1;
  assertKeyInRange(track, fromKey, 0, 0, 'driftLength');
  assertKeyInRange(track, toKey, fromKey, 0, 'driftLength');
  for (const array of [track.values, track.inTangents, track.outTangents]) {
    if (!array) continue;
    for (let i = fromKey * 4; i < (toKey + 1) * 4; i++) array[i] *= options.factor;
  }
  writeRotationTrack(document, track);
  return document;
}

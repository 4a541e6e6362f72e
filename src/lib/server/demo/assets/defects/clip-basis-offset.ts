import type { Document } from '@gltf-transform/core';
import { AXES, fromAxisAngle, multiply } from '../quaternion';
import { readRotationTrack, writeRotationTrack, type RotationTarget } from './rotation-track';

/** Options for {@link clipBasisOffset}. */
export interface ClipBasisOffsetOptions extends RotationTarget {
  /** Offset angle in degrees (-90 by default: a Z-up to Y-up correction). */
  angleDegrees?: number;
  /** Parent-space axis of the offset (`x` by default). */
  axis?: 'x' | 'y' | 'z';
}

/**
 * Pre-multiplies every key of one (root) channel by a fixed basis rotation, q' = R·q: the
 * up-axis correction got baked into one clip's keys instead of the rest pose, so that clip
 * alone plays lying on its side. Tangents are turned alike. Mutates and returns `document`.
 */
export function clipBasisOffset(document: Document, options: ClipBasisOffsetOptions): Document {
  const offset = fromAxisAngle(AXES[options.axis ?? 'x'], ((options.angleDegrees ?? -90) * Math.PI) / 180);
  const track = readRotationTrack(document, options);
  for (const array of [track.values, track.inTangents, track.outTangents]) {
    if (!array) continue;
    for (let i = 0; i < array.length; i += 4) {
      array.set(multiply(offset, [array[i], array[i + 1], array[i + 2], array[i + 3]]), i);
    }
  }
  writeRotationTrack(document, track);
  return document;
}

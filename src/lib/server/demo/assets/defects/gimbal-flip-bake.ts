import type { Document } from '@gltf-transform/core';
import { AXES, fromAxisAngle, multiply } from '../quaternion';
import { assertKeyInRange, getKey, readRotationTrack, writeRotationTrack, type RotationTarget } from './rotation-track';

/** Options for {@link gimbalFlipBake}. */
export interface GimbalFlipBakeOptions extends RotationTarget {
  /** First key of the flipped stretch. */
  keyIndex: number;
  /** How many keys stay flipped before the bake recovers (4 by default). */
  spanKeys?: number;
  /** Size of the flip in degrees (170 by default: near half a turn, with a positive dot kept). */
  flipDegrees?: number;
  /** Local axis the flip happens about (`y`, the pan axis, by default). */
  axis?: 'x' | 'y' | 'z';
}

/**
 * Simulates an Euler bake passing through gimbal lock: for `spanKeys` frames the baked
 * orientation is turned by ~180° about a local axis (the Euler solver jumped to its other
 * branch), then it snaps back. Each snap is a near half turn within one frame, a speed far
 * beyond anything authored. Tangents are turned alike. Mutates and returns `document`.
 */
export function gimbalFlipBake(document: Document, options: GimbalFlipBakeOptions): Document {
  const spanKeys = options.spanKeys ?? 4;
  const flip = fromAxisAngle(AXES[options.axis ?? 'y'], ((options.flipDegrees ?? 170) * Math.PI) / 180);
  const track = readRotationTrack(document, options);
  assertKeyInRange(track, options.keyIndex, 1, spanKeys, 'gimbalFlipBake');
  for (let keyIndex = options.keyIndex; keyIndex < options.keyIndex + spanKeys; keyIndex++) {
    track.values.set(multiply(getKey(track, keyIndex), flip), keyIndex * 4);
    for (const tangents of [track.inTangents, track.outTangents]) {
      if (!tangents) continue;
      const t = tangents.subarray(keyIndex * 4, keyIndex * 4 + 4);
      tangents.set(multiply([t[0], t[1], t[2], t[3]], flip), keyIndex * 4);
    }
  }
  writeRotationTrack(document, track);
  return document;
}

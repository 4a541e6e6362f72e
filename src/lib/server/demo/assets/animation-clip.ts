/**
 * Builds animation clips from smooth functions of time, the way a DCC bake does: one shared
 * time accessor per clip, one sampler per animated property, interpolation always set.
 * LINEAR clips are sampled every frame; CUBICSPLINE clips get fewer keys with exact tangents.
 */
import type { Accessor, Animation, Document, Node } from '@gltf-transform/core';
import { getOrCreateBuffer } from './gltf-buffer';
import { sampleRotation, type AngleCurve } from './rotation-curve';

/** A property driven by a function of time (4 numbers for rotation, 3 for translation or scale). */
export interface SampledTrack {
  node: Node;
  path: 'rotation' | 'translation' | 'scale';
  sample(timeSeconds: number): readonly number[];
}

/** A clip baked from {@link SampledTrack}s at a fixed key rate. */
export interface SampledClipSpec {
  name: string;
  durationSeconds: number;
  interpolation: 'LINEAR' | 'CUBICSPLINE';
  /** Keys per second: 30 (or 24 for cinematics) for a LINEAR bake, a few for CUBICSPLINE. */
  keysPerSecond: number;
  tracks: SampledTrack[];
}

/** A property keyed by hand: explicit times and values. */
export interface KeyedTrack {
  node: Node;
  path: 'rotation' | 'translation' | 'scale';
  interpolation: 'STEP' | 'LINEAR';
  times: readonly number[];
  values: readonly (readonly number[])[];
}

/** Step for the central difference behind CUBICSPLINE tangents; O(h²) error is far below float32. */
const TANGENT_STEP_SECONDS = 1e-4;

/** A rotation track sampled from composed angle curves (see {@link sampleRotation}). */
export function rotationTrack(node: Node, curves: readonly AngleCurve[]): SampledTrack {
  return { node, path: 'rotation', sample: (timeSeconds) => sampleRotation(curves, timeSeconds) };
}

/**
 * Adds a clip sampled from smooth functions. CUBICSPLINE tangents are the time derivative of
 * each function (units per second), which is what glTF 2.0 Appendix C multiplies by the key
 * interval, so the spline follows the function closely between keys.
 */
export function addSampledClip(document: Document, spec: SampledClipSpec): Animation {
  const buffer = getOrCreateBuffer(document);
  const keyCount = Math.round(spec.durationSeconds * spec.keysPerSecond) + 1;
  const times = Float32Array.from({ length: keyCount }, (_, keyIndex) => keyIndex / spec.keysPerSecond);
  const input = document.createAccessor(`${spec.name}.times`).setType('SCALAR').setArray(times).setBuffer(buffer);
  const animation = document.createAnimation(spec.name);
  const isCubic = spec.interpolation === 'CUBICSPLINE';
  for (const track of spec.tracks) {
    const width = track.path === 'rotation' ? 4 : 3;
    const values = new Float32Array(keyCount * width * (isCubic ? 3 : 1));
    for (let keyIndex = 0; keyIndex < keyCount; keyIndex++) {
      const timeSeconds = keyIndex / spec.keysPerSecond;
      const value = track.sample(timeSeconds);
      if (!isCubic) {
        values.set(value, keyIndex * width);
        continue;
      }
      const before = track.sample(timeSeconds - TANGENT_STEP_SECONDS);
      const after = track.sample(timeSeconds + TANGENT_STEP_SECONDS);
      const tangent = value.map((_, i) => (after[i] - before[i]) / (2 * TANGENT_STEP_SECONDS));
      // glTF 2.0 Appendix C: each key stores in-tangent, value, out-tangent; a smooth curve has equal tangents.
      values.set(tangent, keyIndex * width * 3);
      values.set(value, keyIndex * width * 3 + width);
      values.set(tangent, keyIndex * width * 3 + 2 * width);
    }
    const output = document
      .createAccessor(`${spec.name}.${track.node.getName()}.${track.path}`)
      .setType(width === 4 ? 'VEC4' : 'VEC3')
      .setArray(values)
      .setBuffer(buffer);
    addChannel(document, animation, track.node, track.path, input, output, spec.interpolation);
  }
  return animation;
}

/** Adds one hand-keyed track (e.g. a STEP switch) to an existing clip, with its own time accessor. */
export function addKeyedTrack(document: Document, animation: Animation, track: KeyedTrack): void {
  const buffer = getOrCreateBuffer(document);
  const label = `${animation.getName()}.${track.node.getName()}.${track.path}`;
  const input = document
    .createAccessor(`${label}.times`)
    .setType('SCALAR')
    .setArray(Float32Array.from(track.times))
    .setBuffer(buffer);
  const output = document
    .createAccessor(label)
    .setType(track.path === 'rotation' ? 'VEC4' : 'VEC3')
    .setArray(Float32Array.from(track.values.flat()))
    .setBuffer(buffer);
  addChannel(document, animation, track.node, track.path, input, output, track.interpolation);
}

function addChannel(
  document: Document,
  animation: Animation,
  node: Node,
  path: SampledTrack['path'],
  input: Accessor,
  output: Accessor,
  interpolation: 'LINEAR' | 'STEP' | 'CUBICSPLINE'
): void {
  const sampler = document.createAnimationSampler().setInput(input).setOutput(output).setInterpolation(interpolation);
  const channel = document.createAnimationChannel().setTargetNode(node).setTargetPath(path).setSampler(sampler);
  animation.addSampler(sampler).addChannel(channel);
}

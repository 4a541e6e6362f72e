/**
 * One rotation channel of a generated document, read into plain float arrays so a defect can
 * edit keys, then written back. Writing always creates fresh accessors, because the generators
 * share one time accessor per clip and a defect must not leak into its sibling channels.
 */
import type { Accessor, AnimationSampler, Document } from '@gltf-transform/core';
import { DemoAssetError } from '../demo-asset-error';
import { getOrCreateBuffer } from '../gltf-buffer';
import type { Quat } from '../quaternion';

/** Which channel a defect edits: the clip's name and the target node's name. */
export interface RotationTarget {
  animation: string;
  node: string;
}

/** A rotation channel's keys as editable float arrays (4 floats per key). */
export interface RotationTrack {
  sampler: AnimationSampler;
  interpolation: 'LINEAR' | 'STEP' | 'CUBICSPLINE';
  times: Float32Array<ArrayBuffer>;
  values: Float32Array<ArrayBuffer>;
  /** CUBICSPLINE tangents (4 floats per key), else null. */
  inTangents: Float32Array<ArrayBuffer> | null;
  outTangents: Float32Array<ArrayBuffer> | null;
}

/** Finds and reads the rotation channel for `target`. @throws DemoAssetError when it is missing or not float. */
export function readRotationTrack(document: Document, target: RotationTarget): RotationTrack {
  const animation = document
    .getRoot()
    .listAnimations()
    .find((candidate) => candidate.getName() === target.animation);
  const channel = animation
    ?.listChannels()
    .find(
      (candidate) => candidate.getTargetPath() === 'rotation' && candidate.getTargetNode()?.getName() === target.node
    );
  const sampler = channel?.getSampler();
  const input = sampler?.getInput()?.getArray();
  const output = sampler?.getOutput()?.getArray();
  if (!sampler || !input || !output) {
    throw new DemoAssetError(
      'demo.target-missing',
      `No rotation channel for node "${target.node}" in animation "${target.animation}". Check the build plan's target names.`
    );
  }
  if (!(output instanceof Float32Array) || !(input instanceof Float32Array)) {
    throw new DemoAssetError(
      'demo.unsupported-channel',
      `Rotation channel "${target.animation}" / "${target.node}" is not stored as floats; apply key defects before quantizing.`
    );
  }
  const interpolation = sampler.getInterpolation();
  const keyCount = input.length;
  if (interpolation !== 'CUBICSPLINE') {
    return {
      sampler,
      interpolation,
      times: input.slice(),
      values: output.slice(0, keyCount * 4),
      inTangents: null,
      outTangents: null
    };
  }
  const values = new Float32Array(keyCount * 4);
  const inTangents = new Float32Array(keyCount * 4);
  const outTangents = new Float32Array(keyCount * 4);
  for (let keyIndex = 0; keyIndex < keyCount; keyIndex++) {
    // glTF 2.0 Appendix C: per key, in-tangent, value, out-tangent.
    inTangents.set(output.subarray(keyIndex * 12, keyIndex * 12 + 4), keyIndex * 4);
    values.set(output.subarray(keyIndex * 12 + 4, keyIndex * 12 + 8), keyIndex * 4);
    outTangents.set(output.subarray(keyIndex * 12 + 8, keyIndex * 12 + 12), keyIndex * 4);
  }
  return { sampler, interpolation, times: input.slice(), values, inTangents, outTangents };
}

/** Writes a track back into its sampler through new accessors, disposing the old ones once unused. */
export function writeRotationTrack(document: Document, track: RotationTrack): void {
  const buffer = getOrCreateBuffer(document);
  const keyCount = track.times.length;
  let output = track.values;
  if (track.inTangents && track.outTangents) {
    output = new Float32Array(keyCount * 12);
    for (let keyIndex = 0; keyIndex < keyCount; keyIndex++) {
      output.set(track.inTangents.subarray(keyIndex * 4, keyIndex * 4 + 4), keyIndex * 12);
      output.set(track.values.subarray(keyIndex * 4, keyIndex * 4 + 4), keyIndex * 12 + 4);
      output.set(track.outTangents.subarray(keyIndex * 4, keyIndex * 4 + 4), keyIndex * 12 + 8);
    }
  }
  const oldInput = track.sampler.getInput();
  const oldOutput = track.sampler.getOutput();
  track.sampler
    .setInput(document.createAccessor(oldInput?.getName()).setType('SCALAR').setArray(track.times).setBuffer(buffer))
    .setOutput(document.createAccessor(oldOutput?.getName()).setType('VEC4').setArray(output).setBuffer(buffer));
  for (const old of [oldInput, oldOutput]) disposeIfUnused(old);
}

/** Key `keyIndex` as a quaternion. */
export function getKey(track: RotationTrack, keyIndex: number): Quat {
  const offset = keyIndex * 4;
  return [track.values[offset], track.values[offset + 1], track.values[offset + 2], track.values[offset + 3]];
}

/** Checks that `keyIndex` lies in [min, keyCount - 1 - roomAfter]. @throws DemoAssetError otherwise. */
export function assertKeyInRange(
  track: RotationTrack,
  keyIndex: number,
  min: number,
  roomAfter: number,
  what: string
): void {
  const max = track.times.length - 1 - roomAfter;
  if (!Number.isInteger(keyIndex) || keyIndex < min || keyIndex > max) {
    throw new DemoAssetError(
      'demo.key-out-of-range',
      `${what}: key ${keyIndex} is outside ${min}..${max} for a channel of ${track.times.length} keys. Pick a key inside the range.`
    );
  }
}

function disposeIfUnused(accessor: Accessor | null): void {
  // The root is always a parent; any other parent means another sampler or primitive still uses it.
  if (accessor && accessor.listParents().every((parent) => parent.propertyType === 'Root')) accessor.dispose();
}

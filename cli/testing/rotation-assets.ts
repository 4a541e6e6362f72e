/**
 * Small animated glTF assets built in code for the CLI's end-to-end tests: a clean clip, a
 * CUBICSPLINE clip with a hemisphere flip, a clip whose keys drift off unit length. Each clip
 * animates `/Keeper/LanternArm`, a child of an unrotated scene root, so only the defect built in
 * is there to find. Interpolation is always set explicitly.
 */
import { mkdir, writeFile } from 'node:fs/promises';
import { dirname, join } from 'node:path';
import { Document, NodeIO, type Node } from '@gltf-transform/core';
import { ALL_EXTENSIONS } from '@gltf-transform/extensions';
import { quat } from 'gl-matrix';

export type Quaternion = [number, number, number, number];

/** A channel to build: key times in seconds and quaternions (x, y, z, w) per key. */
export interface ChannelSpec {
  interpolation: 'LINEAR' | 'STEP' | 'CUBICSPLINE';
  times: number[];
  keys: Quaternion[];
}

/** Unit quaternion for a turn of `angleDegrees` about `axis`, from gl-matrix `quat.setAxisAngle` (independent oracle). */
export function axisAngle(axis: [number, number, number], angleDegrees: number): Quaternion {
  const q = quat.setAxisAngle(quat.create(), axis, (angleDegrees * Math.PI) / 180);
  return [q[0], q[1], q[2], q[3]];
}

/** -q: the same rotation from the other hemisphere (glTF 2.0 Appendix C: q and -q rotate alike). */
export function negate(q: Quaternion): Quaternion {
  return [-q[0], -q[1], -q[2], -q[3]];
}

/** q scaled to length `length`: a drifted key. */
export function scaled(q: Quaternion, length: number): Quaternion {
  return [q[0] * length, q[1] * length, q[2] * length, q[3] * length];
}

/**
 * Keys 30° or less apart, each about a different axis (so none is reproduced by its neighbours and
 * none is redundant), 0.5 s apart: at most about 80°/s, far below the default 1440°/s ceiling.
 */
export const CLEAN_CHANNEL: ChannelSpec = {
  interpolation: 'LINEAR',
  times: [0, 0.5, 1, 1.5],
  keys: [[0, 0, 0, 1], axisAngle([0, 1, 0], 30), axisAngle([1, 0, 0], 25), axisAngle([0, 0, 1], 20)]
};

/**
 * CUBICSPLINE keys with key 1 stored as -q: consecutive 4D dots are -cos(10°) (Hamilton product
 * algebra: dot of half-angle 0° and 10° about one axis), so each step crosses hemispheres.
 */
export const FLIPPED_CUBIC_CHANNEL: ChannelSpec = {
  interpolation: 'CUBICSPLINE',
  times: [0, 0.5, 1],
  keys: [[0, 0, 0, 1], negate(axisAngle([0, 1, 0], 20)), axisAngle([0, 1, 0], 40)]
};

/** LINEAR keys stored at length 1.05: |length - 1| = 0.05, above the default unitError 1e-2 (policy.ts). */
export const DRIFTING_CHANNEL: ChannelSpec = {
  interpolation: 'LINEAR',
  times: [0, 0.5, 1],
  keys: [scaled([0, 0, 0, 1], 1.05), scaled(axisAngle([1, 0, 0], 20), 1.05), scaled(axisAngle([0, 1, 0], 35), 1.05)]
};

/** A document with one node per channel under an unrotated root, each animated by its channel. */
export function createRotationDocument(channels: readonly ChannelSpec[]): Document {
  const document = new Document();
  const buffer = document.createBuffer();
  const root = document.createNode('Keeper');
  document.createScene('Tidewatch').addChild(root);
  const animation = document.createAnimation('Lantern_Swing');
  channels.forEach((spec, index) => {
    const node: Node = document.createNode(index === 0 ? 'LanternArm' : `LanternArm${index}`);
    root.addChild(node);
    const input = document.createAccessor().setType('SCALAR').setArray(new Float32Array(spec.times)).setBuffer(buffer);
    const output = document
      .createAccessor()
      .setType('VEC4')
      .setArray(new Float32Array(outputValues(spec)))
      .setBuffer(buffer);
    const sampler = document.createAnimationSampler().setInput(input).setOutput(output);
    sampler.setInterpolation(spec.interpolation);
    const channel = document.createAnimationChannel().setTargetNode(node).setTargetPath('rotation').setSampler(sampler);
    animation.addSampler(sampler).addChannel(channel);
  });
  return document;
}

/** glTF 2.0 §3.11.2 (CUBICSPLINE): each key stores in-tangent, value, out-tangent; tangents zero here. */
function outputValues(spec: ChannelSpec): number[] {
  if (spec.interpolation !== 'CUBICSPLINE') return spec.keys.flat();
  return spec.keys.flatMap((key) => [0, 0, 0, 0, ...key, 0, 0, 0, 0]);
}

/** Writes `document` as a .glb at `path`. */
export async function writeGlb(document: Document, path: string): Promise<Uint8Array> {
  const bytes = await new NodeIO().registerExtensions(ALL_EXTENSIONS).writeBinary(document);
  await mkdir(dirname(path), { recursive: true });
  await writeFile(path, bytes);
  return bytes;
}

/** Writes `document` as a .gltf at `path` with its buffer in `<binName>` and its images beside it. */
export async function writeGltf(document: Document, path: string, binName: string): Promise<void> {
  for (const buffer of document.getRoot().listBuffers()) buffer.setURI(binName);
  const { json, resources } = await new NodeIO().registerExtensions(ALL_EXTENSIONS).writeJSON(document);
  await mkdir(dirname(path), { recursive: true });
  await writeFile(path, JSON.stringify(json));
  for (const [uri, bytes] of Object.entries(resources)) {
    const resourcePath = join(dirname(path), uri);
    await mkdir(dirname(resourcePath), { recursive: true });
    await writeFile(resourcePath, bytes);
  }
}

/**
 * Helpers for the demo asset tests: a GLB round trip through @gltf-transform/core, and rotation
 * channels read back into plain numbers with gl-matrix as the independent quaternion oracle.
 * Normalized integer outputs are decoded by the glTF 2.0 §3.11 table, independently of the
 * generators and of the lint library's reader.
 */
import { WebIO, type Document } from '@gltf-transform/core';
import { quat, type ReadonlyQuat } from 'gl-matrix';

/** A key or tangent as (x, y, z, w); plain arrays so tests can index and iterate them. */
export type Quat4 = [number, number, number, number];

/** A rotation channel read back from a document. */
export interface ReadBackTrack {
  animation: string;
  node: string;
  interpolation: string;
  times: number[];
  /** Key values (x, y, z, w). */
  keys: Quat4[];
  /** CUBICSPLINE tangents, else empty. */
  inTangents: Quat4[];
  outTangents: Quat4[];
  componentType: number;
  normalized: boolean;
}

/** Writes `document` as GLB and reads it back, as a consumer of the file would. */
export async function roundTripGlb(document: Document): Promise<Document> {
  const io = new WebIO();
  return await io.readBinary(await io.writeBinary(document));
}

/** Every rotation channel of `document`, in animation then channel order. */
export function listRotationTracks(document: Document): ReadBackTrack[] {
  const tracks: ReadBackTrack[] = [];
  for (const animation of document.getRoot().listAnimations()) {
    for (const channel of animation.listChannels()) {
      if (channel.getTargetPath() !== 'rotation') continue;
      const sampler = channel.getSampler();
      const input = sampler?.getInput();
      const output = sampler?.getOutput();
      if (!sampler || !input || !output) throw new Error(`Incomplete rotation channel in "${animation.getName()}".`);
      const values = decode(output.getArray() as ArrayLike<number>, output.getComponentType(), output.getNormalized());
      const vectors = Array.from({ length: values.length / 4 }, (_, i): Quat4 => [
        values[i * 4],
        values[i * 4 + 1],
        values[i * 4 + 2],
        values[i * 4 + 3]
      ]);
      const isCubic = sampler.getInterpolation() === 'CUBICSPLINE';
      tracks.push({
        animation: animation.getName(),
        node: channel.getTargetNode()?.getName() ?? '',
        interpolation: sampler.getInterpolation(),
        times: Array.from(input.getArray() as ArrayLike<number>),
        keys: isCubic ? vectors.filter((_, i) => i % 3 === 1) : vectors,
        inTangents: isCubic ? vectors.filter((_, i) => i % 3 === 0) : [],
        outTangents: isCubic ? vectors.filter((_, i) => i % 3 === 2) : [],
        componentType: output.getComponentType(),
        normalized: output.getNormalized()
      });
    }
  }
  return tracks;
}

/** The one track for `animation` / `node`; throws when there is none, so tests fail loudly. */
export function findTrack(tracks: readonly ReadBackTrack[], animation: string, node: string): ReadBackTrack {
  const track = tracks.find((candidate) => candidate.animation === animation && candidate.node === node);
  if (!track) throw new Error(`No rotation track ${animation} / ${node}.`);
  return track;
}

/** gl-matrix `quat.dot` of each pair of consecutive keys (index k holds keys k and k + 1). */
export function consecutiveDots(keys: readonly ReadonlyQuat[]): number[] {
  return keys.slice(1).map((key, k) => quat.dot(keys[k], key));
}

/**
 * Rotation angle in degrees between two quaternions, sign-blind: 2·acos(|dot| / (|a||b|)) with
 * gl-matrix `quat.dot` and `quat.length` (the 4D angle is half the rotation angle, common practice).
 */
export function angleDegrees(a: ReadonlyQuat, b: ReadonlyQuat): number {
  const cosine = Math.min(1, Math.abs(quat.dot(a, b)) / (quat.length(a) * quat.length(b)));
  return (2 * Math.acos(cosine) * 180) / Math.PI;
}

/** Decodes accessor components to floats per glTF 2.0 §3.11 (normalized integers). */
function decode(array: ArrayLike<number>, componentType: number, normalized: boolean): number[] {
  const values = Array.from(array);
  if (!normalized) return values;
  // glTF 2.0 §3.11 accessor normalization table: signed types clamp at -1, unsigned divide by their max.
  const decoders: Record<number, (c: number) => number> = {
    5120: (c) => Math.max(c / 127, -1),
    5121: (c) => c / 255,
    5122: (c) => Math.max(c / 32767, -1),
    5123: (c) => c / 65535
  };
  return values.map(decoders[componentType] ?? ((c) => c));
}

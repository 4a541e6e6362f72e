/**
 * Keyframe data read in place: animation sampler accessors become typed-array views of the
 * file's own bytes instead of copies.
 *
 * Design notes: @gltf-transform/core copies every accessor into an array of its own when it reads
 * a file (`ArrayBuffer.slice` per accessor). In an animation file nearly every byte is keyframe
 * data, so that copy is most of the read: on the engine benchmark (46 MB GLB, 2 million keys)
 * the whole read measured about as long as copying 46 MB. A lint only reads keys, so before the
 * reader runs, each animation accessor that can be viewed as it lies (in a buffer view, not
 * sparse, tightly packed, aligned for its component type, not meshopt-compressed) loses its
 * `bufferView` and count in the JSON handed to the reader, which then allocates nothing for it;
 * after the read the accessor gets the view. Anything else is left to the reader as before. The Document
 * then shares the caller's bytes: only for reads that never write the Document back (lint).
 */
import type { Document, TypedArray } from '@gltf-transform/core';
import type { GltfJson } from './gltf-json-schema';

/** One accessor to hand its data back to after the read. */
export interface KeyframeView {
  accessorIndex: number;
  array: TypedArray;
}

type TypedArrayType = new (buffer: ArrayBufferLike, byteOffset: number, length: number) => TypedArray;

/** Array types by glTF componentType (glTF 2.0 §3.6.2.2 "Accessor Data Types"). */
const ARRAY_TYPE: Readonly<Record<number, TypedArrayType>> = {
  5120: Int8Array,
  5121: Uint8Array,
  5122: Int16Array,
  5123: Uint16Array,
  5125: Uint32Array,
  5126: Float32Array
};

/** Components per element by accessor type (glTF 2.0 §3.6.2.2). */
const COMPONENTS: Readonly<Record<string, number>> = {
  SCALAR: 1,
  VEC2: 2,
  VEC3: 3,
  VEC4: 4,
  MAT2: 4,
  MAT3: 9,
  MAT4: 16
};

/**
 * Takes every animation accessor that can be viewed in place out of `json` (its bufferView
 * removed) and returns the views to give back with {@link attachKeyframeViews}. `json` must have
 * passed checkReferences, so every range lies inside its buffer.
 */
export function detachKeyframeAccessors(json: GltfJson, bufferBytes: readonly (Uint8Array | null)[]): KeyframeView[] {
  const accessors = json.accessors ?? [];
  const used = new Set<number>();
  for (const animation of json.animations ?? []) {
    for (const sampler of animation.samplers) {
      used.add(sampler.input);
      used.add(sampler.output);
    }
  }
  const views: KeyframeView[] = [];
  for (const accessorIndex of used) {
    const accessor = accessors[accessorIndex];
    const array = accessor && viewOf(accessor, json, bufferBytes);
    if (!array) continue;
    // No bufferView alone would make the reader allocate a zero-filled array of `count` elements
    // and mark the accessor sparse; with count 0 that array is empty. Both are undone on attach.
    accessors[accessorIndex] = { ...accessor, bufferView: undefined, count: 0 };
    views.push({ accessorIndex, array });
  }
  return views;
}

/** Gives the detached accessors of a Document read from the changed JSON their data. */
export function attachKeyframeViews(document: Document, views: readonly KeyframeView[], accessorCount: number): void {
  if (views.length === 0) return;
  const accessors = document.getRoot().listAccessors();
  // The reader makes one accessor per JSON accessor, in order; anything else is a reader change.
  if (accessors.length !== accessorCount) {
    throw new Error(`the reader made ${accessors.length} accessors for ${accessorCount} in the file`);
  }
  for (const { accessorIndex, array } of views) accessors[accessorIndex].setArray(array).setSparse(false);
}

function viewOf(
  accessor: NonNullable<GltfJson['accessors']>[number],
  json: GltfJson,
  bufferBytes: readonly (Uint8Array | null)[]
): TypedArray | null {
  const ArrayType = ARRAY_TYPE[accessor.componentType];
  const components = COMPONENTS[accessor.type];
  if (accessor.bufferView === undefined || accessor.sparse || !ArrayType || !components) return null;
  const view = json.bufferViews?.[accessor.bufferView];
  const bytes = view && bufferBytes[view.buffer];
  if (!view || !bytes || view.extensions?.EXT_meshopt_compression) return null;
  const componentSize = (ArrayType as unknown as { BYTES_PER_ELEMENT: number }).BYTES_PER_ELEMENT;
  if (view.byteStride !== undefined && view.byteStride !== components * componentSize) return null;
  const byteOffset = bytes.byteOffset + (view.byteOffset ?? 0) + (accessor.byteOffset ?? 0);
  if (byteOffset % componentSize !== 0) return null;
  return new ArrayType(bytes.buffer, byteOffset, accessor.count * components);
}

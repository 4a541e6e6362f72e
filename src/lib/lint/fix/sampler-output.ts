/**
 * Reads a sampler's output accessor into a {@link KeyCurve} and writes edited keys back, without
 * disturbing data that other users of the accessor must keep.
 *
 * Design notes. glTF lets several samplers share one output accessor (and an exporter may share it
 * with something else entirely). A fix therefore never edits a stored array in place: it builds a new
 * array, and {@link commitOutputEdits} decides per accessor. When every user of the accessor gets the
 * same new data, the accessor takes it (no duplication). Otherwise each distinct new content gets a
 * clone of the accessor and only the samplers that need it point to the clone; the original keeps
 * its bytes for everyone else. Keys a fix did not mark changed keep their stored codes exactly, so a
 * quantized BYTE -128 is never rewritten as -127 by a decode/encode round trip.
 */
import type { Accessor, AnimationSampler, Document, TypedArray } from '@gltf-transform/core';
import type { KeyCurve } from './key-curve';
import { decodeComponent, encodeComponent } from './normalized-int';

/** Elements of the output accessor per key: in-tangent, value, out-tangent for CUBICSPLINE (glTF 2.0 §3.11). */
export function elementsPerKey(sampler: AnimationSampler): number {
  return sampler.getInterpolation() === 'CUBICSPLINE' ? 3 : 1;
}

/**
 * Keys the sampler defines: min(input count, output elements / elements per key), as the reader counts
 * them. Elements beyond that are ignored by players and left untouched.
 */
export function countSamplerKeys(sampler: AnimationSampler): number {
  const output = sampler.getOutput();
  if (!output) return 0;
  const inputCount = sampler.getInput()?.getCount() ?? 0;
  return Math.min(inputCount, Math.floor(output.getCount() / elementsPerKey(sampler)));
}

/**
 * The sampler's output decoded to floats (glTF 2.0 §3.11 normalization), split into values and
 * tangents. Null when the output is missing or does not hold `components` per element: 4 for
 * rotation, 3 for translation or scale (the fourth slot of each key then stays 0).
 */
export function readSamplerCurve(sampler: AnimationSampler, components = 4): KeyCurve | null {
  const output = sampler.getOutput();
  const array = output?.getArray();
  if (!output || !array || output.getElementSize() !== components) return null;
  const keyCount = countSamplerKeys(sampler);
  const isCubic = elementsPerKey(sampler) === 3;
  const componentType = output.getComponentType();
  const isNormalized = output.getNormalized();
  const read = (element: number) => {
    const target = new Float64Array(keyCount * 4);
    for (let keyIndex = 0; keyIndex < keyCount; keyIndex++) {
      const source = ((isCubic ? keyIndex * 3 : keyIndex) + element) * components;
      for (let component = 0; component < components; component++)
        // Rounded to float32 like the reader's channels, so fixes and rules see the same numbers.
        target[keyIndex * 4 + component] = Math.fround(
          decodeComponent(array[source + component], componentType, isNormalized)
        );
    }
    return target;
  };
  return {
    keyCount,
    values: read(isCubic ? 1 : 0),
    inTangents: isCubic ? read(0) : null,
    outTangents: isCubic ? read(2) : null,
    changedKeys: new Uint8Array(keyCount)
  };
}

/**
 * A copy of the output's stored array with the curve's changed keys encoded into it (§3.11 for
 * normalized integers); unchanged keys keep their stored codes.
 */
export function encodeSamplerCurve(sampler: AnimationSampler, curve: KeyCurve, components = 4): TypedArray {
  const output = sampler.getOutput() as Accessor;
  const array = (output.getArray() as TypedArray).slice();
  const isCubic = elementsPerKey(sampler) === 3;
  const componentType = output.getComponentType();
  const isNormalized = output.getNormalized();
  const write = (element: number, source: Float64Array) => {
    for (let keyIndex = 0; keyIndex < curve.keyCount; keyIndex++) {
      if (!curve.changedKeys[keyIndex]) continue;
      const target = ((isCubic ? keyIndex * 3 : keyIndex) + element) * components;
      for (let component = 0; component < components; component++)
        array[target + component] = encodeComponent(source[keyIndex * 4 + component], componentType, isNormalized);
    }
  };
  write(isCubic ? 1 : 0, curve.values);
  if (isCubic && curve.inTangents) write(0, curve.inTangents);
  if (isCubic && curve.outTangents) write(2, curve.outTangents);
  return array;
}

/** A new output array for one sampler, produced by a fix. */
export interface OutputEdit {
  sampler: AnimationSampler;
  array: TypedArray;
}

/** What committing edits did, for fix results. */
export interface CommitCounts {
  /** Accessors that took new data in place (every user wanted the same change). */
  accessorsWritten: number;
  /** Accessors cloned because some user of the original must keep the old data. */
  accessorsCloned: number;
}

/**
 * Applies output edits. Edits are grouped by the accessor they replace; an accessor whose users all
 * received identical new data takes it in place, otherwise each distinct new content goes into its
 * own clone and only the samplers that asked for it are repointed.
 */
export function commitOutputEdits(document: Document, edits: readonly OutputEdit[]): CommitCounts {
  const root = document.getRoot();
  const counts: CommitCounts = { accessorsWritten: 0, accessorsCloned: 0 };
  const byAccessor = new Map<Accessor, OutputEdit[]>();
  for (const edit of edits) {
    const output = edit.sampler.getOutput();
    if (!output) continue;
    const group = byAccessor.get(output) ?? [];
    group.push(edit);
    byAccessor.set(output, group);
  }
  for (const [accessor, group] of byAccessor) {
    const contents: { array: TypedArray; samplers: AnimationSampler[] }[] = [];
    for (const edit of group) {
      const same = contents.find((content) => equalArrays(content.array, edit.array));
      if (same) same.samplers.push(edit.sampler);
      else contents.push({ array: edit.array, samplers: [edit.sampler] });
    }
    const editedSamplers = new Set(group.map((edit) => edit.sampler));
    const hasOtherUsers = accessor
      .listParents()
      .some((parent) => parent !== root && !editedSamplers.has(parent as AnimationSampler));
    if (contents.length === 1 && !hasOtherUsers) {
      accessor.setArray(contents[0].array);
      counts.accessorsWritten++;
      continue;
    }
    for (const content of contents) {
      const clone = accessor.clone().setName(fixedName(accessor.getName())).setArray(content.array);
      for (const sampler of content.samplers) sampler.setOutput(clone);
      counts.accessorsCloned++;
    }
  }
  return counts;
}

function equalArrays(a: TypedArray, b: TypedArray): boolean {
  if (a.length !== b.length || a.constructor !== b.constructor) return false;
  for (let index = 0; index < a.length; index++) if (!Object.is(a[index], b[index])) return false;
  return true;
}

/** Name for a fixed copy of an accessor, so a file's accessor names stay tellable apart. */
export function fixedName(name: string): string {
  return name ? `${name} (fixed)` : '';
}

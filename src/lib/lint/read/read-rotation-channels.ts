/**
 * Reads every animation channel that targets `rotation` into a {@link RotationChannel}.
 *
 * Design notes: this is the hot path (the engine benchmark reads 2 million keys). Per channel the
 * work is a handful of property lookups plus, at most, one linear copy:
 * - float32 VEC4 output with LINEAR or STEP: `values` is the accessor's own array (or a subarray
 *   view when the output has more elements than keys). @gltf-transform/core already de-interleaves
 *   and copies accessor data on read, so the array is tightly packed and owned by the Document.
 * - float32 input: `times` is the accessor's array itself; samplers sharing an input share it.
 * - CUBICSPLINE, normalized integers, or other component types: one copy into fresh Float32Arrays.
 *   The CUBICSPLINE split writes values and both tangents into one allocation of 12 floats per key,
 *   then hands out three subarray views of it: one allocation instead of three, same bytes.
 *   A fused single pass (read each key once, write all three regions) was tried; it measured about
 *   15% slower than three passes that each write one region in order (50 channels × 10,000 keys,
 *   min 12.7 ms vs 10.9 ms), so the split stays three passes. Most of the remaining cost is the
 *   first touch of the fresh 24 MB, not the loop. A split loop for float32 sources only (instead
 *   of the shared copyElements) measured within the noise of a busy 2-core machine (fastest runs
 *   11–21 ms either way) and was dropped. Handing out strided views of the output instead of
 *   copies would save the 24 MB, but changes what `values` and the tangents are for every reader.
 * Decoded arrays are cached per accessor for one call, so channels sharing an output (or an input)
 * share one copy: memory stays bounded by the file's own accessors, however many channels alias them.
 * Nothing allocates per key. Rules must treat the arrays as read-only: they may be the Document's.
 */
import type { Accessor, Document } from '@gltf-transform/core';
import { copyElements, quantizationStepOf } from './decode-components';
import { readNodeTree } from './node-tree';
import type { Interpolation, RotationChannel } from './rotation-channel';

const EMPTY = new Float32Array(0);

/** Every rotation channel of every animation, in file order (animation, then channel). */
export function readRotationChannels(document: Document): RotationChannel[] {
  const tree = readNodeTree(document);
  const timesCache = new Map<Accessor, Float32Array>();
  const keysCache = new Map<Accessor, DecodedOutput>();
  const cubicKeysCache = new Map<Accessor, DecodedOutput>();
  const channels: RotationChannel[] = [];
  document
    .getRoot()
    .listAnimations()
    .forEach((animation, animationIndex) => {
      const animationName = animation.getName() || `#${animationIndex}`;
      animation.listChannels().forEach((channel, channelIndex) => {
        if (channel.getTargetPath() !== 'rotation') return;
        const node = channel.getTargetNode();
        const sampler = channel.getSampler();
        // glTF 2.0 §3.11: a channel without a target node is ignored; a channel needs a sampler.
        if (!node || !sampler) return;
        const nodeIndex = tree.indexOf.get(node) ?? -1;
        const interpolation = sampler.getInterpolation() as Interpolation;
        const isCubic = interpolation === 'CUBICSPLINE';
        const input = sampler.getInput();
        const output = sampler.getOutput();
        const inputCount = input ? input.getCount() : 0;
        const decoded = output
          ? cached(isCubic ? cubicKeysCache : keysCache, output, () => decodeOutput(output, isCubic))
          : null;
        const keys = viewKeys(decoded, inputCount, isCubic);
        const rest = node.getRotation();
        channels.push({
          animation: animationName,
          animationIndex,
          channelIndex,
          nodePath: nodeIndex >= 0 ? tree.paths[nodeIndex] : `/${node.getName() || '#?'}`,
          nodeIndex,
          interpolation,
          times: input ? cached(timesCache, input, () => readTimes(input)) : EMPTY,
          values: keys.values,
          inTangents: keys.inTangents,
          outTangents: keys.outTangents,
          keyCount: keys.keyCount,
          raw: {
            inputCount,
            outputCount: output ? output.getCount() : 0,
            outputType: output ? output.getType() : 'VEC4',
            componentType: output ? output.getComponentType() : 5126,
            normalized: output ? output.getNormalized() : false,
            inputType: input ? input.getType() : 'SCALAR',
            inputComponentType: input ? input.getComponentType() : 5126
          },
          quantizationStep: output ? quantizationStepOf(output.getComponentType(), output.getNormalized()) : 0,
          restRotation: [rest[0], rest[1], rest[2], rest[3]],
          isRoot: nodeIndex >= 0 && (tree.parents[nodeIndex] === -1 || tree.isRootJoint[nodeIndex] === 1)
        });
      });
    });
  return channels;
}

function cached<T>(cache: Map<Accessor, T>, accessor: Accessor, read: () => T): T {
  let value = cache.get(accessor);
  if (value === undefined) {
    value = read();
    cache.set(accessor, value);
  }
  return value;
}

/** Key times as float32: the accessor's own array when it already is one. */
function readTimes(input: Accessor): Float32Array {
  const array = input.getArray();
  if (!array) return EMPTY;
  const componentsPerElement = input.getElementSize();
  if (array instanceof Float32Array && componentsPerElement === 1) return array;
  // Not float32 SCALAR (key-times reports it from raw): keep the first component of each element.
  const count = input.getCount();
  const times = new Float32Array(count);
  copyElements(array, 0, componentsPerElement, times, count, 1, input.getComponentType(), input.getNormalized());
  return times;
}

/** Every whole key an output accessor holds, decoded; channels then take views of it. */
interface DecodedOutput {
  values: Float32Array;
  inTangents: Float32Array | null;
  outTangents: Float32Array | null;
  keyCount: number;
}

/**
 * Values and tangents of an output accessor. glTF 2.0 §3.11 / Appendix C: a CUBICSPLINE output
 * holds three elements per key, in-tangent, value, out-tangent. Outputs that are not 4-component
 * have no usable quaternion keys (keyCount 0; rotation-encoding reports them from `raw`).
 */
function decodeOutput(output: Accessor, isCubic: boolean): DecodedOutput {
  const array = output.getArray();
  if (!array || output.getElementSize() !== 4) {
    return { values: EMPTY, inTangents: isCubic ? EMPTY : null, outTangents: isCubic ? EMPTY : null, keyCount: 0 };
  }
  const keyCount = Math.floor(output.getCount() / (isCubic ? 3 : 1));
  const componentType = output.getComponentType();
  const isNormalized = output.getNormalized();

  if (!isCubic) {
    if (array instanceof Float32Array) return { values: array, inTangents: null, outTangents: null, keyCount };
    const values = new Float32Array(keyCount * 4);
    copyElements(array, 0, 4, values, keyCount, 4, componentType, isNormalized);
    return { values, inTangents: null, outTangents: null, keyCount };
  }

  const block = new Float32Array(keyCount * 12);
  const inTangents = block.subarray(0, keyCount * 4);
  const values = block.subarray(keyCount * 4, keyCount * 8);
  const outTangents = block.subarray(keyCount * 8, keyCount * 12);
  copyElements(array, 0, 12, inTangents, keyCount, 4, componentType, isNormalized);
  copyElements(array, 4, 12, values, keyCount, 4, componentType, isNormalized);
  copyElements(array, 8, 12, outTangents, keyCount, 4, componentType, isNormalized);
  return { values, inTangents, outTangents, keyCount };
}

/** A channel's keys: min(input count, whole output keys), as views of the decoded output. */
function viewKeys(decoded: DecodedOutput | null, inputCount: number, isCubic: boolean): DecodedOutput {
  if (!decoded)
    return { values: EMPTY, inTangents: isCubic ? EMPTY : null, outTangents: isCubic ? EMPTY : null, keyCount: 0 };
  const keyCount = Math.min(inputCount, decoded.keyCount);
  const length = keyCount * 4;
  const view = (array: Float32Array | null) => (array && array.length !== length ? array.subarray(0, length) : array);
  return {
    values: view(decoded.values)!,
    inTangents: view(decoded.inTangents),
    outTangents: view(decoded.outTangents),
    keyCount
  };
}

import type { Document } from '@gltf-transform/core';
import { getOrCreateBuffer } from '../gltf-buffer';

/** Options for {@link quantizeRotations}. */
export interface QuantizeRotationsOptions {
  /** Only this animation's channels (all animations by default). */
  animation?: string;
}

/** Largest SHORT value: normalized SHORT maps c to max(c / 32767, -1) (glTF 2.0 §3.11). */
const SHORT_MAX = 32767;

/**
 * Stores LINEAR and STEP rotation outputs as normalized SHORT, the compact encoding glTF 2.0
 * §3.11 allows for rotation samplers (the same normalized-integer scheme KHR_mesh_quantization
 * uses for meshes). This is a valid asset, not a defect: the demo uses it to show quantized
 * files pass. CUBICSPLINE outputs stay float, since tangents may exceed 1. Mutates and returns `document`.
 */
export function quantizeRotations(document: Document, options: QuantizeRotationsOptions = {}): Document {
  const buffer = getOrCreateBuffer(document);
  for (const animation of document.getRoot().listAnimations()) {
    if (options.animation !== undefined && animation.getName() !== options.animation) continue;
    for (const channel of animation.listChannels()) {
      const sampler = channel.getSampler();
      const output = sampler?.getOutput();
      const floats = output?.getArray();
      if (channel.getTargetPath() !== 'rotation' || !sampler || !output || sampler.getInterpolation() === 'CUBICSPLINE')
        continue;
      if (!(floats instanceof Float32Array)) continue;
      const shorts = Int16Array.from(floats, (value) => Math.round(Math.max(-1, Math.min(1, value)) * SHORT_MAX));
      const quantized = document
        .createAccessor(output.getName())
        .setType('VEC4')
        .setArray(shorts)
        .setNormalized(true)
        .setBuffer(buffer);
      sampler.setOutput(quantized);
      if (output.listParents().every((parent) => parent.propertyType === 'Root')) output.dispose();
    }
  }
  return document;
}

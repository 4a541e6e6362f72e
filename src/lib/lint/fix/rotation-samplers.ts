/**
 * Finds the samplers that animate rotations: the ones the key-level fixes edit.
 */
import type { AnimationSampler, Document } from '@gltf-transform/core';

/**
 * Every sampler used by a channel that targets a node's `rotation`, once each, in file order.
 * Channels without a target node or sampler are ignored, as players ignore them (glTF 2.0 §3.11).
 */
export function listRotationSamplers(document: Document): AnimationSampler[] {
  const samplers = new Set<AnimationSampler>();
  for (const animation of document.getRoot().listAnimations())
    for (const channel of animation.listChannels()) {
      const sampler = channel.getSampler();
      if (channel.getTargetPath() === 'rotation' && channel.getTargetNode() && sampler) samplers.add(sampler);
    }
  return [...samplers];
}

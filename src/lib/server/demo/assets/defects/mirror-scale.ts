import type { Document } from '@gltf-transform/core';
import { DemoAssetError } from '../demo-asset-error';

/** Options for {@link mirrorScale}. */
export interface MirrorScaleOptions {
  /** Name of the node to mirror. */
  node: string;
  /** Axis whose scale is negated (`x` by default). */
  axis?: 'x' | 'y' | 'z';
}

/**
 * Negates one scale component of a node, e.g. scale (-1, 1, 1): the quick way to make a
 * left-hand prop from a right-hand one. The node's world basis becomes left-handed (negative
 * determinant, glTF 2.0 §3.7.4 then expects flipped winding), and any rotation under it turns
 * the wrong way. Mutates and returns `document`.
 * @throws DemoAssetError when no node has that name.
 */
export function mirrorScale(document: Document, options: MirrorScaleOptions): Document {
  const node = document
    .getRoot()
    .listNodes()
    .find((candidate) => candidate.getName() === options.node);
  if (!node) {
    throw new DemoAssetError(
      'demo.target-missing',
      `mirrorScale: no node named "${options.node}". Check the build plan.`
    );
  }
  const scale = node.getScale();
  const component = { x: 0, y: 1, z: 2 }[options.axis ?? 'x'];
  scale[component] = -scale[component];
  node.setScale(scale);
  return document;
}

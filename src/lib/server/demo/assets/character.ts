/**
 * A complete character asset: the skinned humanoid rig, its four clips and an optional held
 * prop (a rigid mesh parented to the right hand, the usual way props ride on a skeleton).
 */
import type { Document } from '@gltf-transform/core';
import { createDemoDocument } from './demo-document';
import { addHumanoidClips, type HumanoidClipOptions } from './humanoid-clips';
import { addHumanoidRig, type HumanoidRigOptions } from './humanoid-rig';
import { addShapeMesh, box, mergeShapes, prismBetween } from './mesh-shape';

/** Options for {@link createCharacter}. */
export interface CharacterOptions extends HumanoidRigOptions, HumanoidClipOptions {
  /** A rigid prop carried in the right hand. */
  heldProp?: 'lantern' | 'boathook';
}

/**
 * Builds a character document, e.g. `createCharacter({ name: 'Kelp Diver', swimStyle: 'crawl' })`.
 * Pure: the same options give the same document, and so the same file bytes.
 */
export function createCharacter(options: CharacterOptions): Document {
  const document = createDemoDocument(options.name);
  const rig = addHumanoidRig(document, options);
  addHumanoidClips(document, rig, options);
  if (options.heldProp) {
    const shape =
      options.heldProp === 'lantern'
        ? mergeShapes([box([0.1, 0.14, 0.1], [0, -0.12, 0]), prismBetween([0, -0.05, 0], [0, 0, 0], 0.01)])
        : prismBetween([0, -0.6, 0], [0, 1.2, 0], 0.015);
    const name = options.heldProp === 'lantern' ? 'Lantern' : 'Boathook';
    const prop = document
      .createNode(name)
      .setTranslation([-0.08, 0, 0])
      .setMesh(addShapeMesh(document, name, shape));
    rig.joints['Hand.R'].addChild(prop);
  }
  return document;
}

/**
 * Moves what a node carries (mesh, camera, skin, morph weights, extensions such as lights) to a new
 * child node with a given local rotation. removeBakedBasis uses it when the root it resets to
 * identity carries content itself: the content keeps its world transform through the child, which
 * holds the turn the root gave up.
 */
import { AnimationChannel, type Document, type Node } from '@gltf-transform/core';

/** True when the node carries anything whose placement depends on its own transform. */
export function hasNodeContent(node: Node): boolean {
  return node.getMesh() !== null || node.getCamera() !== null || node.listExtensions().length > 0;
}

/**
 * Creates a child of `node` named `<name> content` with the given rotation, moves the node's mesh,
 * camera, skin, default morph weights and extensions to it, and retargets `weights` animation channels.
 * Returns the new child.
 */
export function moveNodeContent(document: Document, node: Node, rotation: [number, number, number, number]): Node {
  const content = document.createNode(`${node.getName() || 'node'} content`).setRotation(rotation);
  content.setMesh(node.getMesh()).setCamera(node.getCamera()).setSkin(node.getSkin()).setWeights(node.getWeights());
  node.setMesh(null).setCamera(null).setSkin(null).setWeights([]);
  for (const extension of node.listExtensions()) {
    const name = extension.extensionName;
    content.setExtension(name, extension);
    node.setExtension(name, null);
  }
  for (const parent of node.listParents())
    if (parent instanceof AnimationChannel && parent.getTargetNode() === node && parent.getTargetPath() === 'weights')
      parent.setTargetNode(content);
  node.addChild(content);
  return content;
}

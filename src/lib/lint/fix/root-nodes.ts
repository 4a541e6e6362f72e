/**
 * The nodes the basis rules examine: scene roots (nodes without a parent) and root joints (joints
 * with no ancestor among their skin's joints), top down, exactly as the reader's node tree has them.
 */
import type { Document, Node } from '@gltf-transform/core';
import { readNodeTree } from '../read/node-tree';

/** Scene roots and root joints, parents before children. */
export function listRootNodes(document: Document): Node[] {
  const tree = readNodeTree(document);
  return tree.topDownOrder
    .filter((nodeIndex) => tree.parents[nodeIndex] === -1 || tree.isRootJoint[nodeIndex] === 1)
    .map((nodeIndex) => tree.nodes[nodeIndex]);
}

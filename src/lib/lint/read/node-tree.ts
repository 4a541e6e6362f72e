/**
 * The node hierarchy of a Document as flat arrays indexed like the file's `nodes`: parents, paths
 * of names from the scene root, a top-down order, and the joint facts of every skin. Both
 * readRotationChannels and readAssetFacts need it; it walks each node once.
 */
import type { Document, Node } from '@gltf-transform/core';

/** Flat facts about every node, by node index. */
export interface NodeTree {
  nodes: Node[];
  indexOf: Map<Node, number>;
  /** Parent node index, or -1 for a root. */
  parents: Int32Array;
  /** `/Hero/Hips/Spine`; unnamed nodes as `#<index>`. */
  paths: string[];
  /** Node indices with every parent before its children (nodes caught in a cycle are left out). */
  topDownOrder: number[];
  /** 1 where the node is a joint of some skin. */
  isJoint: Uint8Array;
  /** 1 where the node is a joint of some skin with no ancestor among that skin's joints. */
  isRootJoint: Uint8Array;
}

/** Builds the {@link NodeTree} of a Document. */
export function readNodeTree(document: Document): NodeTree {
  const root = document.getRoot();
  const nodes = root.listNodes();
  const indexOf = new Map<Node, number>();
  nodes.forEach((node, nodeIndex) => indexOf.set(node, nodeIndex));

  const parents = new Int32Array(nodes.length).fill(-1);
  nodes.forEach((node, nodeIndex) => {
    for (const child of node.listChildren()) {
      const childIndex = indexOf.get(child);
      if (childIndex !== undefined) parents[childIndex] = nodeIndex;
    }
  });

  const paths = nodes.map((_, nodeIndex) => `/#${nodeIndex}`);
  const topDownOrder: number[] = [];
  const segmentOf = (nodeIndex: number) => nodes[nodeIndex].getName() || `#${nodeIndex}`;
  for (let nodeIndex = 0; nodeIndex < nodes.length; nodeIndex++) {
    if (parents[nodeIndex] !== -1) continue;
    paths[nodeIndex] = `/${segmentOf(nodeIndex)}`;
    topDownOrder.push(nodeIndex);
  }
  // Breadth-first from the roots: the order list grows while it is walked.
  for (let cursor = 0; cursor < topDownOrder.length; cursor++) {
    const parentIndex = topDownOrder[cursor];
    for (const child of nodes[parentIndex].listChildren()) {
      const childIndex = indexOf.get(child)!;
      paths[childIndex] = `${paths[parentIndex]}/${segmentOf(childIndex)}`;
      topDownOrder.push(childIndex);
    }
  }

  const isJoint = new Uint8Array(nodes.length);
  const isRootJoint = new Uint8Array(nodes.length);
  for (const skin of root.listSkins()) {
    const joints = new Set<number>();
    for (const joint of skin.listJoints()) joints.add(indexOf.get(joint)!);
    for (const jointIndex of joints) {
      isJoint[jointIndex] = 1;
      let ancestor = parents[jointIndex];
      for (let depth = 0; ancestor !== -1 && !joints.has(ancestor) && depth < nodes.length; depth++) {
        ancestor = parents[ancestor];
      }
      if (ancestor === -1) isRootJoint[jointIndex] = 1;
    }
  }
  return { nodes, indexOf, parents, paths, topDownOrder, isJoint, isRootJoint };
}

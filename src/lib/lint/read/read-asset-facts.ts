/**
 * Reads the static facts of an asset that node-level rules check: every node's stored rotation,
 * world matrix and handedness, its place in the scene and skins, and each skin's inverse bind
 * matrix handedness.
 */
import type { Document, Node } from '@gltf-transform/core';
import type { AssetFacts, NodeFacts, SkinFacts } from './node-facts';
import { readNodeTree } from './node-tree';
import { getStoredRotationKind } from './stored-rotation';

/** The {@link AssetFacts} of a Document: nodes in file order, skins in file order. */
export function readAssetFacts(document: Document): AssetFacts {
  const tree = readNodeTree(document);
  const worldMatrices = tree.nodes.map(() => identity());
  // Top-down, so each parent's world matrix is final before its children use it.
  for (const nodeIndex of tree.topDownOrder) {
    const local = tree.nodes[nodeIndex].getMatrix();
    const parentIndex = tree.parents[nodeIndex];
    if (parentIndex === -1) worldMatrices[nodeIndex].set(local);
    else multiply(worldMatrices[nodeIndex], worldMatrices[parentIndex], local);
  }

  const nodes: NodeFacts[] = tree.nodes.map((node, nodeIndex) => ({
    nodeIndex,
    nodePath: tree.paths[nodeIndex],
    rotation: storedRotationOf(node),
    worldMatrix: worldMatrices[nodeIndex],
    worldDeterminant: determinant3(worldMatrices[nodeIndex], 0),
    isSceneRoot: tree.parents[nodeIndex] === -1,
    isRootJoint: tree.isRootJoint[nodeIndex] === 1,
    isJoint: tree.isJoint[nodeIndex] === 1,
    hasMesh: node.getMesh() !== null
  }));

  const skins: SkinFacts[] = document
    .getRoot()
    .listSkins()
    .map((skin, skinIndex) => {
      const joints = skin.listJoints();
      const matrices = skin.getInverseBindMatrices()?.getArray() ?? null;
      const inverseBindDeterminants = new Float64Array(joints.length);
      for (let jointIndex = 0; jointIndex < joints.length; jointIndex++) {
        // glTF 2.0 §3.7.3, "Skins": without inverseBindMatrices every matrix is identity (determinant 1).
        // A too-short accessor (only possible in a Document built in code) gives NaN, not a guess.
        if (!matrices) inverseBindDeterminants[jointIndex] = 1;
        else if ((jointIndex + 1) * 16 > matrices.length) inverseBindDeterminants[jointIndex] = NaN;
        else inverseBindDeterminants[jointIndex] = determinant3(matrices, jointIndex * 16);
      }
      return {
        skinIndex,
        name: skin.getName() || `#${skinIndex}`,
        inverseBindDeterminants,
        jointPaths: joints.map((joint) => tree.paths[tree.indexOf.get(joint)!])
      };
    });
  return { nodes, skins };
}

/**
 * The rotation as the file stored it. Nodes read from a file answer from the record taken at read
 * time (null for `matrix` or no rotation). Nodes built in code, or changed since, report their
 * rotation unless it is exactly the identity default (glTF 2.0 §3.5.3, "Transformations").
 */
function storedRotationOf(node: Node): [number, number, number, number] | null {
  const kind = getStoredRotationKind(node);
  const [x, y, z, w] = node.getRotation();
  if (kind === 'matrix') return null;
  if (kind === 'rotation') return [x, y, z, w];
  return x === 0 && y === 0 && z === 0 && w === 1 ? null : [x, y, z, w];
}

function identity(): Float64Array {
  const matrix = new Float64Array(16);
  matrix[0] = matrix[5] = matrix[10] = matrix[15] = 1;
  return matrix;
}

/** out = a × b for column-major 4x4 matrices (glTF 2.0 §3.5.3, "Transformations": a node's world matrix is its parent's times its local one). */
function multiply(out: Float64Array, a: ArrayLike<number>, b: ArrayLike<number>): void {
  for (let column = 0; column < 4; column++) {
    for (let row = 0; row < 4; row++) {
      out[column * 4 + row] =
        a[row] * b[column * 4] +
        a[4 + row] * b[column * 4 + 1] +
        a[8 + row] * b[column * 4 + 2] +
        a[12 + row] * b[column * 4 + 3];
    }
  }
}

/** Determinant of the upper 3x3 of the column-major 4x4 at `offset`: column0 · (column1 × column2). */
function determinant3(m: ArrayLike<number>, offset: number): number {
  const [a0, a1, a2] = [m[offset], m[offset + 1], m[offset + 2]];
  const [b0, b1, b2] = [m[offset + 4], m[offset + 5], m[offset + 6]];
  const [c0, c1, c2] = [m[offset + 8], m[offset + 9], m[offset + 10]];
  return a0 * (b1 * c2 - b2 * c1) + a1 * (b2 * c0 - b0 * c2) + a2 * (b0 * c1 - b1 * c0);
}

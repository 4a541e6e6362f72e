/**
 * Remembers how each node of a file stored its rotation: as `rotation`, inside `matrix`, or not
 * at all. @gltf-transform/core decomposes `matrix` into TRS on read and fills an absent rotation
 * with identity, so the Document alone cannot tell; node-level rules need to (a matrix-derived
 * rotation is normalized by the decomposition and was never authored as a quaternion).
 * Held in a WeakMap keyed by Node, so it costs nothing once the Document is dropped.
 */
import type { Node } from '@gltf-transform/core';

/** How a node's rotation appeared in the file. */
export type StoredRotationKind = 'rotation' | 'matrix' | 'none';

const storedKinds = new WeakMap<Node, StoredRotationKind>();

/** Records the kinds for the nodes of a freshly read Document, given the file's node JSON in the same order. */
export function recordStoredRotations(
  nodes: readonly Node[],
  nodeDefinitions: readonly { rotation?: number[]; matrix?: number[] }[]
): void {
  nodes.forEach((node, nodeIndex) => {
    const definition = nodeDefinitions[nodeIndex];
    storedKinds.set(node, definition?.matrix ? 'matrix' : definition?.rotation ? 'rotation' : 'none');
  });
}

/** How the node's rotation was stored in the file it was read from; undefined for nodes built in code. */
export function getStoredRotationKind(node: Node): StoredRotationKind | undefined {
  return storedKinds.get(node);
}

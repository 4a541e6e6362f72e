/**
 * Static facts about one node, read once per asset for the node-level rules
 * (unit-drift and not-a-rotation on rest rotations, baked-basis, mirrored-basis).
 */
export interface NodeFacts {
  nodeIndex: number;
  /** Path of names from the scene root, e.g. `/Hero/Hips` (unnamed nodes as `#<index>`). */
  nodePath: string;
  /** The node's own `rotation` (x, y, z, w) as stored, or null when it has none (or uses `matrix`). */
  rotation: [number, number, number, number] | null;
  /** Column-major 4x4 world matrix (spec §3.5.3) of the node in its first scene. */
  worldMatrix: Float64Array;
  /** Determinant of the world matrix's upper 3x3; negative means a handedness flip (spec §3.7.4). */
  worldDeterminant: number;
  /** A root of a scene (no parent). */
  isSceneRoot: boolean;
  /** A joint of some skin with no ancestor joint in that skin. */
  isRootJoint: boolean;
  /** A joint of some skin. */
  isJoint: boolean;
  /** The node has a mesh (so a mirrored transform flips its triangles' winding). */
  hasMesh: boolean;
}

/** A skin's inverse bind matrices, reduced to what mirrored-basis needs. */
export interface SkinFacts {
  skinIndex: number;
  name: string;
  /** Determinant of each inverse bind matrix's upper 3x3, in joint order. */
  inverseBindDeterminants: Float64Array;
  /** Node paths of the joints, in joint order. */
  jointPaths: string[];
}

/** Everything the rules learn about one asset besides its rotation channels. */
export interface AssetFacts {
  nodes: NodeFacts[];
  skins: SkinFacts[];
}

/**
 * A rotation channel already read into plain typed arrays: what every key-level rule checks.
 * The reader settles everything glTF leaves open (normalized integers decoded per spec §3.11,
 * CUBICSPLINE tangents split out, sparse accessors applied, meshopt buffers decoded), so rules
 * never touch @gltf-transform objects in their loops.
 */
export type Interpolation = 'LINEAR' | 'STEP' | 'CUBICSPLINE';

export interface RotationChannel {
  /** Animation name, or `#<index>` when unnamed. */
  animation: string;
  animationIndex: number;
  /** Channel index within the animation. */
  channelIndex: number;
  /** Node path of names from the scene root, e.g. `/Hero/Hips/Spine` (unnamed nodes as `#<index>`). */
  nodePath: string;
  nodeIndex: number;
  interpolation: Interpolation;
  /** Key times in seconds as stored (may be broken: key-times checks them). */
  times: Float32Array;
  /**
   * Key values, 4 floats per key (x, y, z, w), decoded to floats. Length 4 × keyCount.
   * May be a view of the Document's own accessor data: treat as read-only.
   */
  values: Float32Array;
  /** CUBICSPLINE in-tangents (4 per key), else null. */
  inTangents: Float32Array | null;
  /** CUBICSPLINE out-tangents (4 per key), else null. */
  outTangents: Float32Array | null;
  /**
   * Keys usable by value rules: min(input count, output elements / (3 for CUBICSPLINE else 1)).
   * 0 when the output is not a 4-component type (no quaternion can be read from it).
   */
  keyCount: number;
  /** Raw facts for the structural rules (key-times, rotation-encoding). */
  raw: {
    inputCount: number;
    /** Output accessor element count (3 per key for CUBICSPLINE). */
    outputCount: number;
    /** Output accessor type as in glTF (`VEC4` expected). */
    outputType: string;
    /** glTF componentType enum (5126 FLOAT, 5120 BYTE, 5121 UNSIGNED_BYTE, 5122 SHORT, 5123 UNSIGNED_SHORT...). */
    componentType: number;
    normalized: boolean;
    /** Input accessor type as in glTF (`SCALAR` expected); set by the reader, optional for hand-built channels. */
    inputType?: string;
    /** Input accessor componentType (5126 FLOAT expected). */
    inputComponentType?: number;
  };
  /** Smallest step the encoding can represent (0 for float): quantized tolerances derive from it. */
  quantizationStep: number;
  /** The node's rest `rotation` (x, y, z, w). */
  restRotation: [number, number, number, number];
  /** The node is a scene root, or a joint with no joint ancestor in its skin. */
  isRoot: boolean;
}

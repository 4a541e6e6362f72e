/**
 * A small humanoid skeleton with a skinned low-poly body: hips, spine, neck, head, and per
 * side a shoulder, upper arm, forearm, hand, thigh, shin and foot (18 joints). The bind pose is
 * a T-pose with identity joint rotations, so every animated rotation is relative to rest.
 */
import type { Document, Node, TypedArray } from '@gltf-transform/core';
import { getOrCreateBuffer } from './gltf-buffer';
import { mergeShapes, prismBetween, type Shape } from './mesh-shape';
import type { Vec3 } from './quaternion';

/** Joint names of the rig, parents before children (the skin's joint order). */
export const HUMANOID_JOINTS = [
  'Hips',
  'Spine',
  'Neck',
  'Head',
  'Shoulder.L',
  'UpperArm.L',
  'Forearm.L',
  'Hand.L',
  'Shoulder.R',
  'UpperArm.R',
  'Forearm.R',
  'Hand.R',
  'Thigh.L',
  'Shin.L',
  'Foot.L',
  'Thigh.R',
  'Shin.R',
  'Foot.R'
] as const;

/** One joint name of the rig. */
export type HumanoidJoint = (typeof HUMANOID_JOINTS)[number];

/** Options for {@link addHumanoidRig}. */
export interface HumanoidRigOptions {
  /** Name of the character's root node, e.g. `Kelp Diver`. */
  name: string;
  /** Uniform size factor on the default 1.75 m proportions. */
  heightScale?: number;
}

/** The nodes of a rig: its root, its skinned body and each joint by name. */
export interface HumanoidRig {
  root: Node;
  body: Node;
  joints: Record<HumanoidJoint, Node>;
}

interface JointSpec {
  parent: HumanoidJoint | null;
  /** Local translation from the parent joint, metres at scale 1. */
  offset: Vec3;
  /** End of the limb piece in the joint's own space (the child joint, or a tip). */
  tip: Vec3;
  radius: number;
}

// prettier-ignore
const JOINT_SPECS: Record<HumanoidJoint, JointSpec> = {
  Hips: { parent: null, offset: [0, 0.95, 0], tip: [0, 0.2, 0], radius: 0.12 },
  Spine: { parent: 'Hips', offset: [0, 0.2, 0], tip: [0, 0.3, 0], radius: 0.14 },
  Neck: { parent: 'Spine', offset: [0, 0.3, 0], tip: [0, 0.1, 0], radius: 0.05 },
  Head: { parent: 'Neck', offset: [0, 0.1, 0], tip: [0, 0.22, 0.02], radius: 0.09 },
  'Shoulder.L': { parent: 'Spine', offset: [0.05, 0.26, 0], tip: [0.13, 0, 0], radius: 0.05 },
  'UpperArm.L': { parent: 'Shoulder.L', offset: [0.13, 0, 0], tip: [0.28, 0, 0], radius: 0.045 },
  'Forearm.L': { parent: 'UpperArm.L', offset: [0.28, 0, 0], tip: [0.25, 0, 0], radius: 0.04 },
  'Hand.L': { parent: 'Forearm.L', offset: [0.25, 0, 0], tip: [0.1, 0, 0.02], radius: 0.035 },
  'Shoulder.R': { parent: 'Spine', offset: [-0.05, 0.26, 0], tip: [-0.13, 0, 0], radius: 0.05 },
  'UpperArm.R': { parent: 'Shoulder.R', offset: [-0.13, 0, 0], tip: [-0.28, 0, 0], radius: 0.045 },
  'Forearm.R': { parent: 'UpperArm.R', offset: [-0.28, 0, 0], tip: [-0.25, 0, 0], radius: 0.04 },
  'Hand.R': { parent: 'Forearm.R', offset: [-0.25, 0, 0], tip: [-0.1, 0, 0.02], radius: 0.035 },
  'Thigh.L': { parent: 'Hips', offset: [0.1, -0.04, 0], tip: [0, -0.44, 0], radius: 0.07 },
  'Shin.L': { parent: 'Thigh.L', offset: [0, -0.44, 0], tip: [0, -0.42, 0], radius: 0.055 },
  'Foot.L': { parent: 'Shin.L', offset: [0, -0.42, 0], tip: [0, -0.05, 0.16], radius: 0.04 },
  'Thigh.R': { parent: 'Hips', offset: [-0.1, -0.04, 0], tip: [0, -0.44, 0], radius: 0.07 },
  'Shin.R': { parent: 'Thigh.R', offset: [0, -0.44, 0], tip: [0, -0.42, 0], radius: 0.055 },
  'Foot.R': { parent: 'Shin.R', offset: [0, -0.42, 0], tip: [0, -0.05, 0.16], radius: 0.04 }
};

/**
 * Adds the rig to the document's first scene (created when missing): a root node holding the
 * skinned body mesh and the joint hierarchy, a skin with inverse bind matrices (glTF 2.0 §3.7.3)
 * and one prism per joint weighted fully to that joint.
 */
export function addHumanoidRig(document: Document, options: HumanoidRigOptions): HumanoidRig {
  const scale = options.heightScale ?? 1;
  const buffer = getOrCreateBuffer(document);
  const scene = document.getRoot().listScenes()[0] ?? document.createScene('Scene');
  const root = document.createNode(options.name);
  scene.addChild(root);

  const joints = {} as Record<HumanoidJoint, Node>;
  const worldPositions = {} as Record<HumanoidJoint, Vec3>;
  const pieces: Shape[] = [];
  const jointIndices: number[] = [];
  const inverseBindMatrices: number[] = [];
  HUMANOID_JOINTS.forEach((name, jointIndex) => {
    const spec = JOINT_SPECS[name];
    const offset = spec.offset.map((v) => v * scale) as Vec3;
    const node = document.createNode(name).setTranslation(offset);
    (spec.parent ? joints[spec.parent] : root).addChild(node);
    joints[name] = node;
    const parentWorld: Vec3 = spec.parent ? worldPositions[spec.parent] : [0, 0, 0];
    const world: Vec3 = [parentWorld[0] + offset[0], parentWorld[1] + offset[1], parentWorld[2] + offset[2]];
    worldPositions[name] = world;
    const tip: Vec3 = [world[0] + spec.tip[0] * scale, world[1] + spec.tip[1] * scale, world[2] + spec.tip[2] * scale];
    pieces.push(prismBetween(world, tip, spec.radius * scale));
    jointIndices.push(...Array<number>(6).fill(jointIndex));
    // Bind pose has no joint rotation, so the inverse bind matrix only undoes the joint's position (column-major).
    inverseBindMatrices.push(1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1, 0, -world[0], -world[1], -world[2], 1);
  });

  const shape = mergeShapes(pieces);
  const vertexCount = shape.positions.length / 3;
  const accessor = (name: string, type: 'SCALAR' | 'VEC3' | 'VEC4' | 'MAT4', array: TypedArray) =>
    document.createAccessor(`${options.name}.${name}`).setType(type).setArray(array).setBuffer(buffer);
  const jointsAttribute = new Uint8Array(vertexCount * 4);
  const weightsAttribute = new Float32Array(vertexCount * 4);
  for (let vertex = 0; vertex < vertexCount; vertex++) {
    jointsAttribute[vertex * 4] = jointIndices[vertex];
    weightsAttribute[vertex * 4] = 1;
  }
  const primitive = document
    .createPrimitive()
    .setAttribute('POSITION', accessor('position', 'VEC3', Float32Array.from(shape.positions)))
    .setAttribute('JOINTS_0', accessor('joints', 'VEC4', jointsAttribute))
    .setAttribute('WEIGHTS_0', accessor('weights', 'VEC4', weightsAttribute))
    .setIndices(accessor('indices', 'SCALAR', Uint16Array.from(shape.indices)));
  const mesh = document.createMesh(`${options.name} Body`).addPrimitive(primitive);

  const skin = document
    .createSkin(`${options.name} Skin`)
    .setSkeleton(joints.Hips)
    .setInverseBindMatrices(accessor('inverseBind', 'MAT4', Float32Array.from(inverseBindMatrices)));
  for (const name of HUMANOID_JOINTS) skin.addJoint(joints[name]);
  const body = document.createNode(`${options.name} Body`).setMesh(mesh).setSkin(skin);
  root.addChild(body);
  return { root, body, joints };
}

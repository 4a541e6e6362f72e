/**
 * Document builders and byte snapshots for the fix tests. Every channel states its interpolation
 * and every accessor has a name, so tests can say which accessors a fix may touch and compare
 * all the others byte for byte. The scenario is the Tidewatch demo project. Test support only.
 */
import { Document, type Animation, type Node, type TypedArray } from '@gltf-transform/core';
import { mat4, quat, type vec3 } from 'gl-matrix';
import type { Interpolation } from '../read/rotation-channel';

export type TargetPath = 'rotation' | 'translation' | 'scale';

/** One channel to add: stored output data as given (float32 or integers for quantized outputs). */
export interface ChannelSpec {
  node: Node;
  path?: TargetPath;
  interpolation: Interpolation;
  times: number[];
  output: TypedArray;
  normalized?: boolean;
  /** Accessor name prefix; defaults to `<node>.<path>`. */
  name?: string;
}

/** A document with a buffer, a scene `Harbor` and an animation `Sway`, ready for nodes and channels. */
export function createHarborDocument(): { document: Document; animation: Animation } {
  const document = new Document();
  document.createBuffer();
  document.createScene('Harbor');
  const animation = document.createAnimation('Sway');
  return { document, animation };
}

/** Creates a node; a parentless node joins the scene. */
export function addNode(
  document: Document,
  name: string,
  parent: Node | null = null,
  transform: { translation?: number[]; rotation?: number[]; scale?: number[] } = {}
): Node {
  const node = document.createNode(name);
  if (transform.translation) node.setTranslation(transform.translation as [number, number, number]);
  if (transform.rotation) node.setRotation(transform.rotation as [number, number, number, number]);
  if (transform.scale) node.setScale(transform.scale as [number, number, number]);
  if (parent) parent.addChild(node);
  else document.getRoot().listScenes()[0].addChild(node);
  return node;
}

/** Adds a channel with its own input (`<name>.times`) and output (`<name>.values`) accessors. */
export function addChannel(document: Document, animation: Animation, spec: ChannelSpec) {
  const path = spec.path ?? 'rotation';
  const name = spec.name ?? `${spec.node.getName()}.${path}`;
  const buffer = document.getRoot().listBuffers()[0];
  const input = document
    .createAccessor(`${name}.times`)
    .setType('SCALAR')
    .setArray(new Float32Array(spec.times))
    .setBuffer(buffer);
  const output = document
    .createAccessor(`${name}.values`)
    .setType(path === 'rotation' ? 'VEC4' : 'VEC3')
    .setArray(spec.output)
    .setNormalized(spec.normalized ?? false)
    .setBuffer(buffer);
  const sampler = document
    .createAnimationSampler()
    .setInput(input)
    .setOutput(output)
    .setInterpolation(spec.interpolation);
  animation.addSampler(sampler);
  const channel = document.createAnimationChannel().setTargetNode(spec.node).setTargetPath(path).setSampler(sampler);
  animation.addChannel(channel);
  return { channel, sampler, input, output };
}

/** Copies of every accessor's stored bytes, by name (fixes give the copies they make a new name). */
export function snapshotAccessors(document: Document): Map<string, Uint8Array> {
  const snapshot = new Map<string, Uint8Array>();
  for (const accessor of document.getRoot().listAccessors()) {
    const array = accessor.getArray();
    if (array)
      snapshot.set(accessor.getName(), new Uint8Array(array.buffer, array.byteOffset, array.byteLength).slice());
  }
  return snapshot;
}

/** Stored bytes of every accessor of a GLB, by name: parses the container (glTF 2.0 §4.4) by hand. */
export function readGlbAccessorBytes(glb: Uint8Array): Map<string, Uint8Array> {
  const view = new DataView(glb.buffer, glb.byteOffset, glb.byteLength);
  const jsonLength = view.getUint32(12, true);
  const json = JSON.parse(new TextDecoder().decode(glb.subarray(20, 20 + jsonLength)));
  const binStart = 20 + jsonLength + 8;
  const componentBytes: Record<number, number> = { 5120: 1, 5121: 1, 5122: 2, 5123: 2, 5125: 4, 5126: 4 };
  const components: Record<string, number> = { SCALAR: 1, VEC2: 2, VEC3: 3, VEC4: 4, MAT4: 16 };
  const result = new Map<string, Uint8Array>();
  for (const accessor of json.accessors ?? []) {
    const bufferView = json.bufferViews[accessor.bufferView];
    const elementBytes = componentBytes[accessor.componentType] * components[accessor.type];
    const stride = bufferView.byteStride ?? elementBytes;
    const start = binStart + (bufferView.byteOffset ?? 0) + (accessor.byteOffset ?? 0);
    const bytes = new Uint8Array(accessor.count * elementBytes);
    for (let element = 0; element < accessor.count; element++)
      bytes.set(
        glb.subarray(start + element * stride, start + element * stride + elementBytes),
        element * elementBytes
      );
    result.set(accessor.name, bytes);
  }
  return result;
}

/** Float32 quaternions for a rotation by `angleDegrees` about a unit axis, one per angle. */
export function axisAngleKeys(axis: [number, number, number], anglesDegrees: number[]): Float32Array<ArrayBuffer> {
  const keys = new Float32Array(anglesDegrees.length * 4);
  anglesDegrees.forEach((angle, keyIndex) => {
    const half = (angle * Math.PI) / 360;
    keys.set(
      [axis[0] * Math.sin(half), axis[1] * Math.sin(half), axis[2] * Math.sin(half), Math.cos(half)],
      keyIndex * 4
    );
  });
  return keys;
}

/**
 * World matrices of every named node, every mesh (by mesh name, through the node holding it) and
 * every joint matrix (`<skin>#<joint>`: world × inverse bind, glTF 2.0 §3.7.3), computed with
 * gl-matrix as an independent oracle (world = parent world × T·R·S, §3.5.2-3).
 * With `keyIndex`, every animated TRS property takes its key `keyIndex` first (float outputs only;
 * the fixtures give each animation's channels the same key times, and a key time's value is used
 * as-is, glTF 2.0 Appendix C).
 */
export function worldMatricesAt(document: Document, keyIndex: number | null = null): Map<string, mat4> {
  const pose = new Map<Node, { translation?: number[]; rotation?: number[]; scale?: number[] }>();
  if (keyIndex !== null)
    for (const animation of document.getRoot().listAnimations())
      for (const channel of animation.listChannels()) {
        const node = channel.getTargetNode();
        const sampler = channel.getSampler();
        const path = channel.getTargetPath() as TargetPath;
        if (!node || !sampler || !['rotation', 'translation', 'scale'].includes(path)) continue;
        const output = sampler.getOutput()!;
        const size = output.getElementSize();
        const element = sampler.getInterpolation() === 'CUBICSPLINE' ? keyIndex * 3 + 1 : keyIndex;
        const value = [...output.getArray()!.subarray(element * size, element * size + size)];
        pose.set(node, { ...pose.get(node), [path]: value });
      }
  const worlds = new Map<Node, mat4>();
  const visit = (node: Node, parentWorld: mat4) => {
    const override = pose.get(node) ?? {};
    const rotation = override.rotation ?? node.getRotation();
    const local = mat4.fromRotationTranslationScale(
      mat4.create(),
      quat.normalize(quat.create(), rotation as unknown as quat),
      (override.translation ?? node.getTranslation()) as unknown as vec3,
      (override.scale ?? node.getScale()) as unknown as vec3
    );
    const world = mat4.multiply(mat4.create(), parentWorld, local);
    worlds.set(node, world);
    for (const child of node.listChildren()) visit(child, world);
  };
  for (const scene of document.getRoot().listScenes())
    for (const node of scene.listChildren()) visit(node, mat4.create());

  const result = new Map<string, mat4>();
  for (const [node, world] of worlds) {
    result.set(`node:${node.getName()}`, world);
    const mesh = node.getMesh();
    if (mesh) result.set(`mesh:${mesh.getName()}`, world);
  }
  for (const skin of document.getRoot().listSkins()) {
    const inverseBind = skin.getInverseBindMatrices()?.getArray() ?? null;
    skin.listJoints().forEach((joint, jointIndex) => {
      const bind = inverseBind
        ? (inverseBind.subarray(jointIndex * 16, jointIndex * 16 + 16) as unknown as mat4)
        : mat4.create();
      result.set(`joint:${skin.getName()}#${jointIndex}`, mat4.multiply(mat4.create(), worlds.get(joint)!, bind));
    });
  }
  return result;
}

/**
 * The largest absolute difference between matching entries of two {@link worldMatricesAt} results,
 * and where it is. Entries in `before` that `after` lacks count as Infinity; nodes named in `except`
 * (roots a fix reset on purpose) are skipped.
 */
export function largestWorldDifference(
  before: Map<string, mat4>,
  after: Map<string, mat4>,
  except: readonly string[] = []
): { name: string; difference: number } {
  let largest = { name: '', difference: 0 };
  for (const [name, matrix] of before) {
    if (except.some((node) => name === `node:${node}`)) continue;
    const other = after.get(name);
    const difference = other
      ? Math.max(...[...matrix].map((value, index) => Math.abs(value - other[index])))
      : Infinity;
    if (!(difference <= largest.difference)) largest = { name, difference };
  }
  return largest;
}

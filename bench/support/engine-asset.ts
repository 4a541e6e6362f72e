/**
 * Generates the engine benchmark's asset: a skinned rig of `jointCount` joints (a spine with
 * branches), one rotation channel per joint with `keysPerJoint` keys at 30 keys per second,
 * LINEAR and CUBICSPLINE mixed, and a few deliberate defects per channel (hemisphere flips,
 * drifted lengths, a spin spike), so rules have findings to build as well as keys to scan.
 * Deterministic: the same options give the same bytes.
 */
import { Document, WebIO } from '@gltf-transform/core';

/** Options for {@link buildEngineAsset}. */
export interface EngineAssetOptions {
  jointCount: number;
  keysPerJoint: number;
  /** Every n-th channel uses CUBICSPLINE, the others LINEAR. */
  cubicEvery: number;
}

/** The generated file and what it holds. */
export interface EngineAsset {
  bytes: Uint8Array;
  rotationKeys: number;
  cubicChannels: number;
  linearChannels: number;
}

/** Builds the benchmark GLB with @gltf-transform/core. */
export async function buildEngineAsset(options: EngineAssetOptions): Promise<EngineAsset> {
  const { jointCount, keysPerJoint, cubicEvery } = options;
  const random = mulberry32(0x7e1de);
  const document = new Document();
  const buffer = document.createBuffer();
  const scene = document.createScene('Tidewatch');
  const animation = document.createAnimation('Deckhand_Haul');

  const joints = [];
  for (let jointIndex = 0; jointIndex < jointCount; jointIndex++) {
    const joint = document.createNode(`Deckhand_J${jointIndex}`).setTranslation([0, 0.1, 0]);
    // A spine of every 10th joint, each other joint hanging off the spine joint before it.
    if (jointIndex === 0) scene.addChild(joint);
    else joints[jointIndex % 10 === 0 ? jointIndex - 10 : jointIndex - (jointIndex % 10)].addChild(joint);
    joints.push(joint);
  }
  const inverseBind = new Float32Array(jointCount * 16);
  for (let jointIndex = 0; jointIndex < jointCount; jointIndex++) {
    inverseBind.set([1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1, 0, 0, -0.1 * jointIndex, 0, 1], jointIndex * 16);
  }
  const skin = document
    .createSkin('Deckhand')
    .setInverseBindMatrices(document.createAccessor().setType('MAT4').setArray(inverseBind).setBuffer(buffer));
  for (const joint of joints) skin.addJoint(joint);

  const times = new Float32Array(keysPerJoint);
  for (let keyIndex = 0; keyIndex < keysPerJoint; keyIndex++) times[keyIndex] = keyIndex / 30;
  const input = document.createAccessor().setType('SCALAR').setArray(times).setBuffer(buffer);

  let cubicChannels = 0;
  for (let jointIndex = 0; jointIndex < jointCount; jointIndex++) {
    const isCubic = jointIndex % cubicEvery === cubicEvery - 1;
    if (isCubic) cubicChannels++;
    const values = smoothCurve(keysPerJoint, random);
    addDefects(values, keysPerJoint, jointIndex);
    const output = isCubic ? withTangents(values, keysPerJoint) : values;
    const sampler = document
      .createAnimationSampler()
      .setInput(input)
      .setOutput(document.createAccessor().setType('VEC4').setArray(output).setBuffer(buffer))
      .setInterpolation(isCubic ? 'CUBICSPLINE' : 'LINEAR');
    animation.addSampler(sampler);
    animation.addChannel(
      document.createAnimationChannel().setTargetNode(joints[jointIndex]).setTargetPath('rotation').setSampler(sampler)
    );
  }
  const bytes = await new WebIO().writeBinary(document);
  return {
    bytes,
    rotationKeys: jointCount * keysPerJoint,
    cubicChannels,
    linearChannels: jointCount - cubicChannels
  };
}

/** Unit quaternions turning about a fixed random axis by a slowly swinging angle. */
function smoothCurve(keyCount: number, random: () => number): Float32Array<ArrayBuffer> {
  const values = new Float32Array(keyCount * 4);
  let [x, y, z] = [random() - 0.5, random() - 0.5, random() - 0.5];
  const length = Math.hypot(x, y, z) || 1;
  [x, y, z] = [x / length, y / length, z / length];
  const amplitude = 0.3 + random() * 1.2;
  const frequency = 0.2 + random();
  const phase = random() * Math.PI * 2;
  for (let keyIndex = 0; keyIndex < keyCount; keyIndex++) {
    const angle = amplitude * Math.sin((frequency * keyIndex) / 30 + phase);
    const s = Math.sin(angle / 2);
    values.set([x * s, y * s, z * s, Math.cos(angle / 2)], keyIndex * 4);
  }
  return values;
}

/** A flipped run (two hemisphere jumps), drifted lengths and one spin spike, placed by joint. */
function addDefects(values: Float32Array, keyCount: number, jointIndex: number): void {
  const flipStart = (jointIndex * 37) % (keyCount - 200);
  for (let index = flipStart * 4; index < (flipStart + 60) * 4; index++) values[index] = -values[index];
  for (const keyIndex of [(jointIndex * 53) % keyCount, (jointIndex * 97 + 11) % keyCount]) {
    for (let component = 0; component < 4; component++) values[keyIndex * 4 + component] *= 1.02;
  }
  if (jointIndex % 5 === 0) {
    const spike = 100 + ((jointIndex * 131) % (keyCount - 200));
    values.set([0.7071068, 0, 0, 0.7071068], spike * 4);
  }
}

/** CUBICSPLINE output: in-tangent, value, out-tangent per key (glTF 2.0 Appendix C), central differences. */
function withTangents(values: Float32Array, keyCount: number): Float32Array<ArrayBuffer> {
  const output = new Float32Array(keyCount * 12);
  for (let keyIndex = 0; keyIndex < keyCount; keyIndex++) {
    const previous = Math.max(keyIndex - 1, 0) * 4;
    const next = Math.min(keyIndex + 1, keyCount - 1) * 4;
    for (let component = 0; component < 4; component++) {
      const tangent = (values[next + component] - values[previous + component]) / 2;
      output[keyIndex * 12 + component] = tangent;
      output[keyIndex * 12 + 4 + component] = values[keyIndex * 4 + component];
      output[keyIndex * 12 + 8 + component] = tangent;
    }
  }
  return output;
}

/** Small deterministic PRNG (mulberry32, common practice for reproducible test data). */
function mulberry32(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

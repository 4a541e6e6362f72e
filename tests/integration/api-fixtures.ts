/**
 * glTF inputs for the API tests, built in code with @gltf-transform/core: a small diver rig with
 * one swim clip, clean or with a chosen defect, written as .glb bytes or as .gltf + .bin. Every
 * sampler sets its interpolation explicitly. Rotations are about +Y, built from half-angles
 * (q = [0, sin(θ/2), 0, cos(θ/2)], Shoemake 1985, "Animating rotation with quaternion curves").
 */
import { Document, WebIO } from '@gltf-transform/core';

/** Defects a fixture can carry. */
export type FixtureDefect =
  /** Clean: four unit keys turning 0°, 20°, 50°, 60° about +Y (uneven steps, so no key is redundant). */
  | 'none'
  /** Key 2 is [0, 0, 0, 0]: no rotation at all (not-a-rotation, an error by default). */
  | 'zero-key'
  /** Key times 0, 0.5, 0.4, 1.5: not increasing (key-times, an error by default). */
  | 'backwards-time';

/** Options of {@link diverDocument}. */
export interface DiverOptions {
  defect?: FixtureDefect;
  /** Name of the animated node (changes node paths and so fingerprints). */
  jointName?: string;
  /** Name of the buffer's .bin file when written as .gltf. */
  binName?: string;
}

const DEGREES = Math.PI / 180;

/** A unit quaternion [x, y, z, w] turning `angleDegrees` about +Y. */
export function aboutY(angleDegrees: number): [number, number, number, number] {
  const half = (angleDegrees * DEGREES) / 2;
  return [0, Math.sin(half), 0, Math.cos(half)];
}

/** The diver document: scene root `Diver`, child joint (default `Hips`) animated by clip `Swim`. */
export function diverDocument(options: DiverOptions = {}): Document {
  const defect = options.defect ?? 'none';
  const document = new Document();
  const buffer = document.createBuffer().setURI(options.binName ?? 'diver.bin');
  const scene = document.createScene('Reef');
  const joint = document.createNode(options.jointName ?? 'Hips');
  scene.addChild(document.createNode('Diver').addChild(joint));

  const times = defect === 'backwards-time' ? [0, 0.5, 0.4, 1.5] : [0, 0.5, 1, 1.5];
  const keys = [aboutY(0), aboutY(20), aboutY(50), aboutY(60)];
  if (defect === 'zero-key') keys[2] = [0, 0, 0, 0];

  const input = document.createAccessor().setType('SCALAR').setArray(new Float32Array(times)).setBuffer(buffer);
  const output = document.createAccessor().setType('VEC4').setArray(new Float32Array(keys.flat())).setBuffer(buffer);
  const sampler = document.createAnimationSampler().setInput(input).setOutput(output).setInterpolation('LINEAR');
  const animation = document.createAnimation('Swim').addSampler(sampler);
  animation.addChannel(
    document.createAnimationChannel().setTargetNode(joint).setTargetPath('rotation').setSampler(sampler)
  );
  return document;
}

const io = new WebIO();

/** The document as GLB bytes. */
export async function diverGlb(options: DiverOptions = {}): Promise<Uint8Array> {
  return io.writeBinary(diverDocument(options));
}

/** The document as a .gltf JSON file and its .bin buffer (named by `binName`, default `diver.bin`). */
export async function diverGltf(options: DiverOptions = {}): Promise<{ gltf: Uint8Array; bin: Uint8Array }> {
  const binName = options.binName ?? 'diver.bin';
  const { json, resources } = await io.writeJSON(diverDocument({ ...options, binName }));
  const gltf = new TextEncoder().encode(JSON.stringify(json));
  return { gltf, bin: resources[binName] };
}

/**
 * A GLB with one clip `Tide` of long LINEAR rotation channels about +Y, one per entry of
 * `keyCounts` (key k at k/30 s turning 0.5° more than key k-1, so keys stay unit length), for
 * limits on how many keys one answer plots.
 */
export async function longClipGlb(keyCounts: readonly number[]): Promise<Uint8Array> {
  const document = new Document();
  const buffer = document.createBuffer();
  const scene = document.createScene('Reef');
  const animation = document.createAnimation('Tide');
  keyCounts.forEach((keyCount, index) => {
    const joint = document.createNode(`Kelp${index}`);
    scene.addChild(joint);
    const times = new Float32Array(keyCount);
    const values = new Float32Array(keyCount * 4);
    for (let key = 0; key < keyCount; key++) {
      times[key] = key / 30;
      values.set(aboutY((key * 0.5) % 360), key * 4);
    }
    const sampler = document
      .createAnimationSampler()
      .setInput(document.createAccessor().setType('SCALAR').setArray(times).setBuffer(buffer))
      .setOutput(document.createAccessor().setType('VEC4').setArray(values).setBuffer(buffer))
      .setInterpolation('LINEAR');
    animation.addSampler(sampler);
    animation.addChannel(
      document.createAnimationChannel().setTargetNode(joint).setTargetPath('rotation').setSampler(sampler)
    );
  });
  return io.writeBinary(document);
}

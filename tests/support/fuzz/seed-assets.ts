/**
 * The valid assets the fuzz generators damage: one small rig built with @gltf-transform/core that
 * touches every part of the reader (a mesh with indices, a skin with inverse bind matrices, an
 * image side file, LINEAR, STEP and CUBICSPLINE samplers, a quantized rotation output), written
 * as a GLB and as a .gltf with its `.bin` and `.png` side files. Interpolation is set on every
 * sampler. Rotations are about +Y from half-angles (Shoemake 1985: q = [0, sin(θ/2), 0, cos(θ/2)]).
 */
import { Document, WebIO, type TypedArray } from '@gltf-transform/core';

/** The seed files, and the side-file names the .gltf refers to. */
export interface SeedAssets {
  /** The rig as one GLB (buffer in the BIN chunk, image in a buffer view). */
  glb: Uint8Array;
  /** The rig's .gltf JSON (a fresh object per call of {@link gltfJsonOf}). */
  gltfJson: Record<string, unknown>;
  /** Side files of the .gltf by URI: `fuzz.bin` and `fuzz.png`. */
  sideFiles: Record<string, Uint8Array>;
  binName: string;
  imageName: string;
}

const BIN_NAME = 'fuzz.bin';
const IMAGE_NAME = 'fuzz.png';

/** A unit quaternion [x, y, z, w] turning `angleDegrees` about +Y (Shoemake 1985). */
function aboutY(angleDegrees: number): number[] {
  const half = (angleDegrees * Math.PI) / 360;
  return [0, Math.sin(half), 0, Math.cos(half)];
}

/** The seed rig as a Document. */
export function seedDocument(): Document {
  const document = new Document();
  const buffer = document.createBuffer().setURI(BIN_NAME);
  const scene = document.createScene('Harbor');
  const mast = document.createNode('Mast');
  const lantern = document.createNode('Lantern');
  const flag = document.createNode('Flag');
  const hull = document.createNode('Hull');
  mast.addChild(lantern).addChild(flag);
  scene.addChild(mast).addChild(hull);

  const positions = document
    .createAccessor()
    .setType('VEC3')
    .setArray(new Float32Array([0, 0, 0, 1, 0, 0, 0, 1, 0]))
    .setBuffer(buffer);
  const indices = document
    .createAccessor()
    .setType('SCALAR')
    .setArray(new Uint16Array([0, 1, 2]))
    .setBuffer(buffer);
  const texture = document
    .createTexture('Sail')
    .setImage(new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 1, 2, 3, 4]))
    .setMimeType('image/png')
    .setURI(IMAGE_NAME);
  const material = document.createMaterial('Canvas').setBaseColorTexture(texture);
  const primitive = document
    .createPrimitive()
    .setAttribute('POSITION', positions)
    .setIndices(indices)
    .setMaterial(material);
  hull.setMesh(document.createMesh('HullMesh').addPrimitive(primitive));
  const inverseBindMatrices = document
    .createAccessor()
    .setType('MAT4')
    .setArray(
      new Float32Array(
        [1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1].concat([1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1, 0, 0, -1, 0, 1])
      )
    )
    .setBuffer(buffer);
  hull.setSkin(
    document.createSkin('Rigging').addJoint(mast).addJoint(lantern).setInverseBindMatrices(inverseBindMatrices)
  );

  const animation = document.createAnimation('Sway');
  const addChannel = (
    node: ReturnType<Document['createNode']>,
    path: 'rotation' | 'translation',
    interpolation: 'LINEAR' | 'STEP' | 'CUBICSPLINE',
    times: number[],
    output: TypedArray,
    isNormalized = false
  ) => {
    const input = document.createAccessor().setType('SCALAR').setArray(new Float32Array(times)).setBuffer(buffer);
    const values = document
      .createAccessor()
      .setType(path === 'rotation' ? 'VEC4' : 'VEC3')
      .setArray(output)
      .setNormalized(isNormalized)
      .setBuffer(buffer);
    const sampler = document.createAnimationSampler().setInput(input).setOutput(values).setInterpolation(interpolation);
    animation.addSampler(sampler);
    animation.addChannel(document.createAnimationChannel().setTargetNode(node).setTargetPath(path).setSampler(sampler));
  };
  addChannel(mast, 'rotation', 'LINEAR', [0, 0.5, 1, 1.5], new Float32Array([0, 20, 50, 60].flatMap(aboutY)));
  // CUBICSPLINE output: in-tangent, value, out-tangent per key (glTF 2.0 Appendix C).
  const zero = [0, 0, 0, 0];
  addChannel(
    lantern,
    'rotation',
    'CUBICSPLINE',
    [0, 1, 2],
    new Float32Array([0, 30, 70].flatMap((angle) => [...zero, ...aboutY(angle), ...zero]))
  );
  // Normalized SHORT components decode as c / 32767 (glTF 2.0 §3.11 accessor normalization table).
  addChannel(
    flag,
    'rotation',
    'LINEAR',
    [0, 1],
    new Int16Array([0, 40, 80].slice(0, 2).flatMap((angle) => aboutY(angle).map((value) => Math.round(value * 32767)))),
    true
  );
  addChannel(hull, 'translation', 'STEP', [0, 1], new Float32Array([0, 0, 0, 0, 1, 0]));
  return document;
}

/** Writes the seed rig in both forms. */
export async function buildSeedAssets(): Promise<SeedAssets> {
  const io = new WebIO();
  const glb = await io.writeBinary(seedDocument());
  const { json, resources } = await io.writeJSON(seedDocument(), { basename: 'fuzz' });
  return {
    glb,
    gltfJson: json as unknown as Record<string, unknown>,
    sideFiles: { ...resources },
    binName: BIN_NAME,
    imageName: IMAGE_NAME
  };
}

/** A deep copy of the seed's .gltf JSON, free to mutate. */
export function gltfJsonOf(seed: SeedAssets): Record<string, unknown> {
  return structuredClone(seed.gltfJson);
}

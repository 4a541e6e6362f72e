import type { Document } from '@gltf-transform/core';
import { mat4, quat } from 'gl-matrix';
import { describe, expect, it } from 'vitest';
import { lintDocument } from '../lint-document';
import { defaultPolicy } from '../policy';
import type { FixResult } from './fix-result';
import { removeBakedBasis } from './remove-baked-basis';
import {
  addChannel,
  addNode,
  axisAngleKeys,
  createHarborDocument,
  largestWorldDifference,
  snapshotAccessors,
  worldMatricesAt
} from './sample-documents.fixture';

const policy = defaultPolicy();
const rulesOf = (document: Document) =>
  lintDocument(document, 'characters/harbor-keeper.glb', policy).findings.map((finding) => finding.rule);

const H = Math.SQRT1_2;
const Z_UP_TO_Y_UP: [number, number, number, number] = [-H, 0, 0, H]; // −90° about X (glTF 2.0 §3.4: +Y up)

/**
 * Every matrix of `before` (node worlds, mesh worlds, joint matrices) equals `after`'s within 1e-5
 * (gl-matrix oracle), except the worlds of the folded roots themselves: giving up their turn is the
 * fix. What they carried (meshes, children, joint matrices) must not move.
 */
function expectSameWorld(before: Map<string, mat4>, after: Map<string, mat4>, foldedRoots: string[]): void {
  const largest = largestWorldDifference(before, after, foldedRoots);
  expect(largest.difference, largest.name).toBeLessThan(1e-5);
}

/** gl-matrix inverse of a bind-pose world matrix (the fixtures' matrices are never singular). */
function inverseOf(matrix: mat4): mat4 {
  const inverse = mat4.invert(mat4.create(), matrix);
  if (!inverse) throw new Error('singular bind matrix in a fixture');
  return inverse;
}

/** The world at rest and at every key of the fixture's animations (all channels share 3 key times). */
function allWorlds(document: Document, keyCount: number): Map<string, mat4>[] {
  return [worldMatricesAt(document), ...Array.from({ length: keyCount }, (_, k) => worldMatricesAt(document, k))];
}

/** A skinned, animated Z-up export: the scene root carries the −90° X correction. */
function buildKeeper() {
  const { document, animation } = createHarborDocument();
  const rig = addNode(document, 'KeeperRig', null, {
    translation: [1, 2, 3],
    rotation: Z_UP_TO_Y_UP,
    scale: [2, 2, 2]
  });
  rig.setMesh(document.createMesh('Plinth'));
  const armature = addNode(document, 'Armature', rig, {
    translation: [0, 0.5, 1.5],
    rotation: [0.1, 0.2, 0.05, 0.972]
  });
  const hips = addNode(document, 'Hips', armature, { translation: [0, 0, 1], rotation: [0.05, 0, 0.2, 0.978] });
  const spine = addNode(document, 'Spine', hips, { translation: [0, 0.1, 0.4] });
  const lantern = addNode(document, 'LanternHolder', rig, { translation: [0.3, -0.2, 1.1], scale: [1, 2, 0.5] });
  lantern.setMesh(document.createMesh('Lantern'));
  addNode(document, 'Body', rig).setMesh(document.createMesh('KeeperBody'));

  // Inverse bind matrices from the bind pose (gl-matrix inverse of each joint's world).
  const bind = worldMatricesAt(document);
  const inverseBind = new Float32Array(32);
  inverseBind.set(inverseOf(bind.get('node:Hips')!), 0);
  inverseBind.set(inverseOf(bind.get('node:Spine')!), 16);
  const skin = document
    .createSkin('KeeperSkin')
    .addJoint(hips)
    .addJoint(spine)
    .setInverseBindMatrices(
      document
        .createAccessor('KeeperSkin.inverseBind')
        .setType('MAT4')
        .setArray(inverseBind)
        .setBuffer(document.getRoot().listBuffers()[0])
    );
  document
    .getRoot()
    .listNodes()
    .find((node) => node.getName() === 'Body')!
    .setSkin(skin);

  const times = [0, 0.5, 1];
  addChannel(document, animation, {
    node: armature,
    interpolation: 'LINEAR',
    times,
    output: axisAngleKeys([0, 0, 1], [0, 20, 40])
  });
  addChannel(document, animation, {
    node: armature,
    path: 'translation',
    interpolation: 'LINEAR',
    times,
    output: new Float32Array([0, 0.5, 1.5, 0.2, 0.5, 1.5, 0.4, 0.6, 1.5])
  });
  addChannel(document, animation, {
    node: lantern,
    path: 'scale',
    interpolation: 'STEP',
    times,
    output: new Float32Array([1, 2, 0.5, 1, 2, 0.6, 1, 2, 0.7])
  });
  const hipsKeys = axisAngleKeys([1, 0, 0], [5, 15, 25]);
  const cubic = new Float32Array(36);
  for (let k = 0; k < 3; k++) cubic.set(hipsKeys.subarray(k * 4, k * 4 + 4), k * 12 + 4);
  addChannel(document, animation, { node: hips, interpolation: 'CUBICSPLINE', times, output: cubic });
  return { document, animation, rig, armature, hips, spine, skin };
}

describe('removeBakedBasis', () => {
  it('folds a scene root turn into its children and clips: every world and joint matrix stays, at rest and at every key', async () => {
    const { document, rig } = buildKeeper();
    expect(rulesOf(document)).toContain('baked-basis');
    const before = allWorlds(document, 3);

    await document.transform(removeBakedBasis());

    const after = allWorlds(document, 3);
    before.forEach((matrices, index) => expectSameWorld(matrices, after[index], ['KeeperRig']));
    expect(rig.getRotation()).toEqual([0, 0, 0, 1]);
    expect(rulesOf(document)).not.toContain('baked-basis');
  });

  it('moves content carried by the root itself to a new child that holds the turn', async () => {
    const { document, rig } = buildKeeper();
    await document.transform(removeBakedBasis());
    const content = rig.listChildren().find((child) => child.getName() === 'KeeperRig content')!;
    expect(content.getMesh()!.getName()).toBe('Plinth');
    expect(rig.getMesh()).toBeNull();
    content.getRotation().forEach((value, index) => expect(value).toBeCloseTo(Z_UP_TO_Y_UP[index], 12));
  });

  it('leaves accessors of channels below the children, of scale channels and of the skin byte-identical', async () => {
    const { document } = buildKeeper();
    const before = snapshotAccessors(document);
    await document.transform(removeBakedBasis());
    const after = snapshotAccessors(document);
    const untouched = [...before.keys()].filter((name) => !name.startsWith('Armature.') || name.endsWith('.times'));
    expect(untouched).toContain('Hips.rotation.values');
    expect(untouched).toContain('LanternHolder.scale.values');
    expect(untouched).toContain('KeeperSkin.inverseBind');
    for (const name of untouched) expect(after.get(name), name).toEqual(before.get(name));
    expect(after.get('Armature.rotation.values')).not.toEqual(before.get('Armature.rotation.values'));
  });

  it('rotates child translation keys by whole quarter turns, so they move and negate exactly', async () => {
    const { document } = buildKeeper();
    await document.transform(removeBakedBasis());
    const keys = document
      .getRoot()
      .listAccessors()
      .find((a) => a.getName() === 'Armature.translation.values')!
      .getArray()!;
    // −90° about X maps (x, y, z) to (x, z, −y) (right-handed, glTF 2.0 §3.4).
    expect([...keys]).toEqual([0, 1.5, -0.5, 0.2, 1.5, -0.5, 0.4, 1.5, -0.6].map(Math.fround));
  });

  it('folds again where the fold leaves a root joint turned, and premultiplies its inverse bind matrix', async () => {
    const { document, animation } = createHarborDocument();
    const rig = addNode(document, 'GullRig', null, { rotation: [0, H, 0, H] }); // 90° about Y
    const root = addNode(document, 'Root', rig, { translation: [0, 1, 0] });
    const wing = addNode(document, 'Wing', root, { translation: [0.5, 0, 0], rotation: [0, 0, 0.1, 0.995] });
    addNode(document, 'GullBody', rig).setMesh(document.createMesh('Gull'));
    const bind = worldMatricesAt(document);
    const inverseBind = new Float32Array(32);
    inverseBind.set(inverseOf(bind.get('node:Root')!), 0);
    inverseBind.set(inverseOf(bind.get('node:Wing')!), 16);
    const skin = document.createSkin('GullSkin').addJoint(root).addJoint(wing);
    skin.setInverseBindMatrices(
      document
        .createAccessor('GullSkin.inverseBind')
        .setType('MAT4')
        .setArray(inverseBind)
        .setBuffer(document.getRoot().listBuffers()[0])
    );
    addChannel(document, animation, {
      node: root,
      interpolation: 'LINEAR',
      times: [0, 0.5, 1],
      output: axisAngleKeys([0, 0, 1], [0, 10, 0])
    });
    addChannel(document, animation, {
      node: wing,
      interpolation: 'LINEAR',
      times: [0, 0.5, 1],
      output: axisAngleKeys([1, 0, 0], [0, 30, 60])
    });
    const before = allWorlds(document, 3);

    await document.transform(removeBakedBasis());

    allWorlds(document, 3).forEach((matrices, index) => expectSameWorld(before[index], matrices, ['GullRig', 'Root']));
    expect(root.getRotation()).toEqual([0, 0, 0, 1]);
    expect(lintDocument(document, 'props/gull.glb', policy).findings.filter((f) => f.rule === 'baked-basis')).toEqual(
      []
    );
  });

  it('keeps a non-uniform root scale exact by permuting it, including its scale keys and rotation keys', async () => {
    const { document, animation } = createHarborDocument();
    const crate = addNode(document, 'Crate', null, { rotation: [0, H, 0, H], scale: [1, 2, 3] });
    addNode(document, 'Lid', crate, { translation: [0, 0.5, 0] }).setMesh(document.createMesh('CrateLid'));
    const times = [0, 0.5, 1];
    const wobble = axisAngleKeys([0, 0, 1], [0, 4, -3]);
    const keys = new Float32Array(12);
    for (let k = 0; k < 3; k++)
      keys.set(quat.multiply(quat.create(), wobble.subarray(k * 4, k * 4 + 4) as quat, [0, H, 0, H] as quat), k * 4);
    addChannel(document, animation, { node: crate, interpolation: 'LINEAR', times, output: keys });
    addChannel(document, animation, {
      node: crate,
      path: 'scale',
      interpolation: 'LINEAR',
      times,
      output: new Float32Array([1, 2, 3, 1, 2.5, 3, 1.5, 2, 3])
    });
    const before = allWorlds(document, 3);

    await document.transform(removeBakedBasis());

    allWorlds(document, 3).forEach((matrices, index) => expectSameWorld(before[index], matrices, ['Crate']));
    expect(crate.getScale()).toEqual([3, 2, 1]); // 90° about Y swaps the X and Z axes
  });

  it('clones a sampler a child shares with a node that must not change', async () => {
    const { document, animation } = createHarborDocument();
    const rig = addNode(document, 'BuoyRig', null, { rotation: Z_UP_TO_Y_UP });
    const buoy = addNode(document, 'Buoy', rig);
    const bell = addNode(document, 'Bell', buoy);
    const { sampler, output } = addChannel(document, animation, {
      node: buoy,
      interpolation: 'LINEAR',
      times: [0, 1, 2],
      output: axisAngleKeys([0, 0, 1], [0, 15, 30])
    });
    animation.addChannel(
      document.createAnimationChannel().setTargetNode(bell).setTargetPath('rotation').setSampler(sampler)
    );
    const original = [...output.getArray()!];
    const before = allWorlds(document, 3);
    const results: FixResult[] = [];

    await document.transform(removeBakedBasis({ onResult: (result) => results.push(result) }));

    allWorlds(document, 3).forEach((matrices, index) => expectSameWorld(before[index], matrices, ['BuoyRig']));
    const [buoyChannel, bellChannel] = animation.listChannels();
    expect(bellChannel.getSampler()).toBe(sampler);
    expect([...sampler.getOutput()!.getArray()!]).toEqual(original);
    expect(buoyChannel.getSampler()).not.toBe(sampler);
    expect(results[0]).toMatchObject({ accessorsCloned: 1 });
  });

  it('takes a common quarter-turn offset out of a root clip (clip-basis-offset); this changes what the clip shows', async () => {
    const { document, animation } = createHarborDocument();
    const keeper = addNode(document, 'Keeper');
    const sway = axisAngleKeys([0, 1, 0], [0, 8, -6]);
    const keys = new Float32Array(12);
    // Every key is the −90° X turn times a small sway: the clip was exported Z-up, the rig Y-up.
    for (let k = 0; k < 3; k++)
      keys.set(
        quat.multiply(quat.create(), Z_UP_TO_Y_UP as unknown as quat, sway.subarray(k * 4, k * 4 + 4) as quat),
        k * 4
      );
    addChannel(document, animation, { node: keeper, interpolation: 'LINEAR', times: [0, 1, 2], output: keys });
    expect(rulesOf(document)).toContain('clip-basis-offset');

    await document.transform(removeBakedBasis({ rest: false }));

    const fixed = document
      .getRoot()
      .listAccessors()
      .find((a) => a.getName() === 'Keeper.rotation.values')!
      .getArray()!;
    [...fixed].forEach((value, index) => expect(value).toBeCloseTo(sway[index], 6)); // C⁻¹·(C·sway) = sway
    expect(rulesOf(document)).not.toContain('clip-basis-offset');
  });

  it('rounds turned quantized keys from unit length, so they land within one BYTE step of it', async () => {
    const { document, animation } = createHarborDocument();
    const rig = addNode(document, 'SkiffRig', null, { rotation: Z_UP_TO_Y_UP });
    const oar = addNode(document, 'Oar', rig);
    // Lengths 0.9915, 1.0078 and 0.9922: inside unit-drift's two-step BYTE tolerance (2/127), so legal input.
    const codes = new Int8Array([71, 0, 0, 104, 0, 45, 0, 120, -20, 0, 15, 124]);
    addChannel(document, animation, {
      node: oar,
      interpolation: 'LINEAR',
      times: [0, 1, 2],
      output: codes,
      normalized: true
    });

    await document.transform(removeBakedBasis());

    const fixed = document
      .getRoot()
      .listAccessors()
      .find((a) => a.getName() === 'Oar.rotation.values')!
      .getArray()!;
    for (let k = 0; k < 3; k++) {
      // glTF 2.0 §3.11: BYTE decodes as max(c/127, −1).
      const length = Math.hypot(...[...fixed.subarray(k * 4, k * 4 + 4)].map((c) => Math.max(c / 127, -1)));
      expect(Math.abs(length - 1)).toBeLessThanOrEqual(1 / 127);
    }
    expect(rulesOf(document)).not.toContain('unit-drift');
  });

  it('leaves a root whose rest is no principal turn, and its clips, alone; and changes nothing on a second run', async () => {
    const { document, animation } = createHarborDocument();
    const dock = addNode(document, 'Dock', null, { rotation: [0, 0.2588, 0, 0.9659] }); // 30° about Y
    addChannel(document, animation, {
      node: dock,
      interpolation: 'LINEAR',
      times: [0, 1],
      output: axisAngleKeys([0, 1, 0], [30, 35])
    });
    const before = snapshotAccessors(document);
    const results: FixResult[] = [];
    await document.transform(removeBakedBasis({ onResult: (result) => results.push(result) }));
    expect(snapshotAccessors(document)).toEqual(before);
    expect(results[0]).toEqual({
      fix: 'removeBakedBasis',
      keysChanged: 0,
      nodesChanged: 0,
      accessorsWritten: 0,
      accessorsCloned: 0
    });

    const keeper = buildKeeper().document;
    await keeper.transform(removeBakedBasis());
    const once = snapshotAccessors(keeper);
    await keeper.transform(removeBakedBasis());
    expect(snapshotAccessors(keeper)).toEqual(once);
  });
});

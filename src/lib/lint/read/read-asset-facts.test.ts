import { Document } from '@gltf-transform/core';
import { mat3, mat4, quat } from 'gl-matrix';
import { describe, expect, it } from 'vitest';
import { readAssetDocument } from './read-asset-document';
import { readAssetFacts } from './read-asset-facts';
import { jsonBytes, sourceFromBytes } from './testing';

function rigDocument() {
  const document = new Document();
  const scene = document.createScene('Harbor');
  const hull = document.createNode('Hull').setTranslation([1, 2, 3]).setRotation([0, 0.6, 0, 0.8]);
  const mast = document
    .createNode('Mast')
    .setTranslation([0, 4, 0])
    .setRotation([0.28, 0, 0, 0.96])
    .setScale([-1, 1, 1]);
  const lantern = document.createNode('').setMesh(document.createMesh('Glass'));
  scene.addChild(hull);
  hull.addChild(mast);
  mast.addChild(lantern);
  return { document, hull, mast, lantern };
}

describe('readAssetFacts', () => {
  it('computes column-major world matrices and their 3x3 determinants (gl-matrix as oracle)', () => {
    const { document } = rigDocument();
    const facts = readAssetFacts(document);
    // gl-matrix mat4.fromRotationTranslationScale builds T·R·S column-major (glTF 2.0 §3.5.3, "Transformations").
    const hullLocal = mat4.fromRotationTranslationScale(mat4.create(), [0, 0.6, 0, 0.8], [1, 2, 3], [1, 1, 1]);
    const mastLocal = mat4.fromRotationTranslationScale(mat4.create(), [0.28, 0, 0, 0.96], [0, 4, 0], [-1, 1, 1]);
    const mastWorld = mat4.multiply(mat4.create(), hullLocal, mastLocal);
    const [hull, mast, lantern] = facts.nodes;
    Array.from(mastWorld).forEach((value, index) => expect(mast.worldMatrix[index]).toBeCloseTo(value, 6));
    Array.from(mastWorld).forEach((value, index) => expect(lantern.worldMatrix[index]).toBeCloseTo(value, 6));
    const determinantOf = (matrix: mat4) => mat3.determinant(mat3.fromMat4(mat3.create(), matrix));
    // gl-matrix works in float32, so agreement is to about 1e-7.
    expect(hull.worldDeterminant).toBeCloseTo(determinantOf(hullLocal), 6);
    // A scale of -1 on one axis flips handedness: determinant −1 (rotations have determinant 1).
    expect(mast.worldDeterminant).toBeCloseTo(-1, 6);
    expect(lantern.worldDeterminant).toBeCloseTo(determinantOf(mastWorld), 6);
  });

  it('gives paths, roots and meshes, and the stored rotation of nodes built in code', () => {
    const facts = readAssetFacts(rigDocument().document);
    expect(facts.nodes.map((node) => node.nodePath)).toEqual(['/Hull', '/Hull/Mast', '/Hull/Mast/#2']);
    expect(facts.nodes.map((node) => node.isSceneRoot)).toEqual([true, false, false]);
    expect(facts.nodes.map((node) => node.hasMesh)).toEqual([false, false, true]);
    // Identity is the default rotation (glTF 2.0 §3.5.3), so a code-built node without one reports null.
    expect(facts.nodes.map((node) => node.rotation)).toEqual([[0, 0.6, 0, 0.8], [0.28, 0, 0, 0.96], null]);
  });

  it('reports a file node rotation as stored, and none for a matrix node or a node without one', async () => {
    // Matrix: a quarter turn about Y, column-major (glTF 2.0 §3.5.3).
    const q = quat.setAxisAngle(quat.create(), [0, 1, 0], Math.PI / 2);
    const matrix = Array.from(mat4.fromQuat(mat4.create(), q));
    const json = {
      asset: { version: '2.0' },
      scenes: [{ nodes: [0, 1, 2] }],
      nodes: [{ name: 'Stored', rotation: [0, 0, 0, 1] }, { name: 'Matrix', matrix }, { name: 'Bare' }]
    };
    const facts = readAssetFacts(await readAssetDocument(sourceFromBytes('harbor.gltf', jsonBytes(json))));
    expect(facts.nodes.map((node) => node.rotation)).toEqual([[0, 0, 0, 1], null, null]);
    // The matrix still turns the world: its rotation part matches gl-matrix's.
    [0, 1, 2, 4, 5, 6, 8, 9, 10].forEach((index) =>
      expect(facts.nodes[1].worldMatrix[index]).toBeCloseTo(matrix[index], 6)
    );
  });

  it('marks joints and root joints, and gives inverse bind determinants per joint', () => {
    const document = new Document();
    const buffer = document.createBuffer();
    const scene = document.createScene();
    const armature = document.createNode('Armature');
    const hips = document.createNode('Hips');
    const spine = document.createNode('Spine');
    scene.addChild(armature);
    armature.addChild(hips);
    hips.addChild(spine);
    // Second joint's inverse bind matrix mirrors X: determinant −1.
    const inverseBind = new Float32Array([
      ...[1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1],
      ...[-1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1, 0, 0, -1, 0, 1]
    ]);
    document
      .createSkin('Deckhand')
      .addJoint(hips)
      .addJoint(spine)
      .setInverseBindMatrices(document.createAccessor().setType('MAT4').setArray(inverseBind).setBuffer(buffer));
    const facts = readAssetFacts(document);
    expect(facts.nodes.map((node) => [node.nodePath, node.isJoint, node.isRootJoint])).toEqual([
      ['/Armature', false, false],
      ['/Armature/Hips', true, true],
      ['/Armature/Hips/Spine', true, false]
    ]);
    expect(facts.skins).toHaveLength(1);
    expect(Array.from(facts.skins[0].inverseBindDeterminants)).toEqual([1, -1]);
    expect(facts.skins[0].jointPaths).toEqual(['/Armature/Hips', '/Armature/Hips/Spine']);
  });
});

import { glMatrix, quat, vec3 } from 'gl-matrix';
import { describe, expect, test } from 'vitest';
import { createCharacter } from '../character';
import { roundTripGlb } from '../testing';
import { bakeZUpCorrection, Z_UP_CORRECTION_NODE } from './bake-z-up-correction';

glMatrix.setMatrixArrayType(Array);

const headPosition = (document: Awaited<ReturnType<typeof roundTripGlb>>) => {
  const head = document
    .getRoot()
    .listNodes()
    .find((node) => node.getName() === 'Head')!;
  return head.getWorldTranslation();
};

describe('bakeZUpCorrection', () => {
  test('wraps the scene content in one root rotated -90° about X', async () => {
    const original = await roundTripGlb(createCharacter({ name: 'Fixture' }));
    const corrected = await roundTripGlb(bakeZUpCorrection(createCharacter({ name: 'Fixture' })));
    const [root, ...others] = corrected.getRoot().listScenes()[0].listChildren();
    expect(others).toEqual([]);
    expect(root.getName()).toBe(Z_UP_CORRECTION_NODE);
    expect(root.listChildren().map((child) => child.getName())).toEqual(['Fixture']);
    // Oracle: gl-matrix quat.setAxisAngle for -90° about X, the usual Z-up to Y-up turn (glTF 2.0 §3.4: +Y up).
    const expected = quat.setAxisAngle(quat.create(), [1, 0, 0], -Math.PI / 2);
    root.getRotation().forEach((v, i) => expect(v).toBeCloseTo(expected[i], 6));
    // Everything below turns with it: the head moves as gl-matrix vec3.transformQuat predicts.
    const moved = vec3.transformQuat(vec3.create(), headPosition(original), expected);
    headPosition(corrected).forEach((v, i) => expect(v).toBeCloseTo(moved[i], 5));
  });

  test('names the wrapper as asked', async () => {
    const corrected = await roundTripGlb(
      bakeZUpCorrection(createCharacter({ name: 'Fixture' }), { nodeName: 'Armature' })
    );
    expect(corrected.getRoot().listScenes()[0].listChildren()[0].getName()).toBe('Armature');
  });
});

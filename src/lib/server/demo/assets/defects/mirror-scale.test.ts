import { glMatrix, mat4 } from 'gl-matrix';
import { describe, expect, test } from 'vitest';
import { createCharacter } from '../character';
import { DemoAssetError } from '../demo-asset-error';
import { roundTripGlb } from '../testing';
import { mirrorScale } from './mirror-scale';

glMatrix.setMatrixArrayType(Array);

const fixture = () => createCharacter({ name: 'Fixture', heldProp: 'boathook' });
const determinantOf = (document: Awaited<ReturnType<typeof roundTripGlb>>, name: string) => {
  const node = document
    .getRoot()
    .listNodes()
    .find((candidate) => candidate.getName() === name)!;
  // Oracle: gl-matrix mat4.determinant; glTF 2.0 §3.7.4: a negative determinant mirrors (flips winding).
  return mat4.determinant(node.getWorldMatrix() as unknown as mat4);
};

describe('mirrorScale', () => {
  test('negates one scale component so the node’s world basis turns left-handed', async () => {
    const before = await roundTripGlb(fixture());
    const after = await roundTripGlb(mirrorScale(fixture(), { node: 'Boathook' }));
    expect(determinantOf(before, 'Boathook')).toBeGreaterThan(0);
    expect(determinantOf(after, 'Boathook')).toBeLessThan(0);
    expect(
      after
        .getRoot()
        .listNodes()
        .find((node) => node.getName() === 'Boathook')!
        .getScale()
    ).toEqual([-1, 1, 1]);
    // Its parent is untouched: the mirror starts at the named node.
    expect(determinantOf(after, 'Hand.R')).toBeGreaterThan(0);
  });

  test('mirrors along the axis asked for', async () => {
    const after = await roundTripGlb(mirrorScale(fixture(), { node: 'Boathook', axis: 'z' }));
    expect(
      after
        .getRoot()
        .listNodes()
        .find((node) => node.getName() === 'Boathook')!
        .getScale()
    ).toEqual([1, 1, -1]);
  });

  test('refuses a node name the document does not have', () => {
    expect(() => mirrorScale(fixture(), { node: 'Anchor' })).toThrow(DemoAssetError);
  });
});

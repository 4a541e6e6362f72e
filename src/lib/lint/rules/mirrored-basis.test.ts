import { describe, expect, it } from 'vitest';
import { Matrix4, Quaternion, Vector3 } from 'three';
import { mirroredBasis } from './mirrored-basis';
import { factsFrom, nodeFrom, runRule } from './testing';

/** Determinant of a TRS world matrix through three.js Matrix4 (the oracle; glTF 2.0 §3.7.4 reads its sign). */
function determinantOf(scale: [number, number, number]): number {
  return new Matrix4().compose(new Vector3(), new Quaternion(), new Vector3(...scale)).determinant();
}

describe('mirrored-basis', () => {
  it('reports the node where mirroring starts, counting the meshes and joints below it', () => {
    const mirrored = determinantOf([-1, 1, 1]);
    expect(mirrored).toBeLessThan(0);
    const facts = factsFrom([
      nodeFrom({ nodePath: '/Keeper', worldDeterminant: 1 }),
      nodeFrom({ nodePath: '/Keeper/MirrorL', worldDeterminant: mirrored, hasMesh: true }),
      nodeFrom({ nodePath: '/Keeper/MirrorL/Hand', worldDeterminant: mirrored, hasMesh: true, isJoint: true })
    ]);
    const findings = runRule(mirroredBasis, { facts });
    expect(findings).toHaveLength(1);
    expect(findings[0]).toMatchObject({
      node: '/Keeper/MirrorL',
      severity: 'warning',
      values: { meshes: 2, joints: 1 }
    });
    expect(findings[0].message).toContain('§3.7.4');
  });

  it('stays quiet for proper transforms, including a double mirror (determinant back to positive)', () => {
    const facts = factsFrom([
      nodeFrom({ nodePath: '/Keeper', worldDeterminant: determinantOf([2, 2, 2]) }),
      nodeFrom({ nodePath: '/Keeper/Flip', worldDeterminant: determinantOf([-1, -1, 1]) })
    ]);
    expect(runRule(mirroredBasis, { facts })).toEqual([]);
  });

  it('reports a skin whose inverse bind matrices mirror', () => {
    const skins = [
      {
        skinIndex: 0,
        name: 'Keeper',
        inverseBindDeterminants: Float64Array.from([1, determinantOf([1, -1, 1]), 1]),
        jointPaths: ['/Keeper/Hips', '/Keeper/Hips/ArmL', '/Keeper/Hips/ArmR']
      }
    ];
    const findings = runRule(mirroredBasis, { facts: factsFrom([], skins) });
    expect(findings).toHaveLength(1);
    expect(findings[0]).toMatchObject({ node: '/Keeper/Hips/ArmL', target: 'skin:0', values: { mirroredJoints: 1 } });
  });

  it('treats a zero determinant (a flattened axis) as no mirror (threshold)', () => {
    const facts = factsFrom([nodeFrom({ nodePath: '/Flat', worldDeterminant: determinantOf([1, 0, 1]) })]);
    expect(runRule(mirroredBasis, { facts })).toEqual([]);
  });
});

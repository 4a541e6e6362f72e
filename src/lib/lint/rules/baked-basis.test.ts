import { describe, expect, it } from 'vitest';
import { Matrix4, Quaternion, Vector3 } from 'three';
import { bakedBasis } from './baked-basis';
import { axisAngle, factsFrom, nodeFrom, runRule } from './testing';

// glTF 2.0 §3.4: +Y up, front +Z. −90° about X maps +Z (up in a Z-up tool) onto +Y.
const zUpToYUp = axisAngle([1, 0, 0], -90);

describe('baked-basis', () => {
  it('reports a scene root that carries the Z-up to Y-up turn', () => {
    const facts = factsFrom([nodeFrom({ nodePath: '/Armature', rotation: zUpToYUp, isSceneRoot: true })]);
    const findings = runRule(bakedBasis, { facts });
    expect(findings).toHaveLength(1);
    expect(findings[0]).toMatchObject({
      node: '/Armature',
      severity: 'warning',
      values: { axis: 'X', angleDegrees: -90 }
    });
    expect(findings[0].message).toContain('Z-up to Y-up');
    expect(findings[0].hint).toContain('orientry fix');
  });

  it('reports a root joint turned half round about Y (content facing −Z)', () => {
    const facts = factsFrom([
      nodeFrom({ nodePath: '/Rig/Hips', rotation: axisAngle([0, 1, 0], 180), isRootJoint: true, isJoint: true })
    ]);
    expect(runRule(bakedBasis, { facts })[0].values).toMatchObject({ axis: 'Y', angleDegrees: 180 });
  });

  it('reads a scene root stored as a matrix through its world matrix (three.js Matrix4.compose)', () => {
    const q = new Quaternion(...zUpToYUp);
    const worldMatrix = Float64Array.from(
      new Matrix4().compose(new Vector3(0, 1, 0), q, new Vector3(0.01, 0.01, 0.01)).elements
    );
    const facts = factsFrom([nodeFrom({ nodePath: '/Scaled', worldMatrix, isSceneRoot: true })]);
    expect(runRule(bakedBasis, { facts })).toHaveLength(1);
  });

  it('stays quiet for identity roots, non-root nodes, and when the policy does not require the glTF basis', () => {
    const facts = factsFrom([
      nodeFrom({ nodePath: '/Keeper', rotation: [0, 0, 0, 1], isSceneRoot: true }),
      nodeFrom({ nodePath: '/Keeper/Arm', rotation: zUpToYUp })
    ]);
    expect(runRule(bakedBasis, { facts })).toEqual([]);
    const baked = factsFrom([nodeFrom({ nodePath: '/Armature', rotation: zUpToYUp, isSceneRoot: true })]);
    expect(runRule(bakedBasis, { facts: baked, policy: { convention: { requireGltfBasis: false } } })).toEqual([]);
  });

  it('matches within convention.basisToleranceDegrees only (threshold at 0.5°)', () => {
    const near = factsFrom([nodeFrom({ nodePath: '/A', rotation: axisAngle([1, 0, 0], -90.4), isSceneRoot: true })]);
    const far = factsFrom([nodeFrom({ nodePath: '/B', rotation: axisAngle([1, 0, 0], -90.6), isSceneRoot: true })]);
    expect(runRule(bakedBasis, { facts: near })).toHaveLength(1);
    expect(runRule(bakedBasis, { facts: far })).toEqual([]);
  });
});

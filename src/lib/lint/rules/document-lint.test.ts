/**
 * End to end: documents built in code with @gltf-transform/core (interpolation always set
 * explicitly), read and linted by lintDocument with every rule on the default policy, plus one
 * real reference asset whose facts come from tests/fixtures/reference/MANIFEST.md.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { Document, type Node } from '@gltf-transform/core';
import { describe, expect, it } from 'vitest';
import { lintDocument } from '../lint-document';
import { defaultPolicy, parsePolicy } from '../policy';
import { readAssetDocument } from '../read/read-asset-document';
import { axisAngle, steadyTurn } from './testing';

interface ClipSpec {
  node: Node;
  interpolation: 'LINEAR' | 'STEP' | 'CUBICSPLINE';
  times: number[];
  /** Accessor elements: one VEC4 per key, or in-tangent, value, out-tangent per key for CUBICSPLINE. */
  output: number[][];
}

function animate(document: Document, name: string, clips: ClipSpec[]): void {
  const buffer = document.getRoot().listBuffers()[0] ?? document.createBuffer();
  const animation = document.createAnimation(name);
  for (const clip of clips) {
    const input = document.createAccessor().setType('SCALAR').setArray(Float32Array.from(clip.times)).setBuffer(buffer);
    const output = document
      .createAccessor()
      .setType('VEC4')
      .setArray(Float32Array.from(clip.output.flat()))
      .setBuffer(buffer);
    const sampler = document
      .createAnimationSampler()
      .setInput(input)
      .setOutput(output)
      .setInterpolation(clip.interpolation);
    animation.addSampler(sampler);
    animation.addChannel(
      document.createAnimationChannel().setTargetNode(clip.node).setTargetPath('rotation').setSampler(sampler)
    );
  }
}

function rulesOf(findings: { rule: string }[]): string[] {
  return findings.map((finding) => finding.rule);
}

describe('rules on documents built with @gltf-transform/core', () => {
  it('finds a hemisphere flip and a drifted key on a LINEAR channel, and names the node path', () => {
    const document = new Document();
    const keeper = document.createNode('Keeper');
    const arm = document.createNode('Arm');
    keeper.addChild(arm);
    document.createScene('Tidewatch').addChild(keeper);
    // Uneven steps, so no key is reproduced by its neighbours (redundant-keys stays quiet).
    const keys: number[][] = [0, 3, 8, 10, 17, 19, 26, 30, 31, 38, 40, 47].map((degrees) =>
      axisAngle([0, 0, 1], degrees)
    );
    keys[5] = keys[5].map((c) => -c);
    keys[9] = keys[9].map((c) => c * 1.03);
    animate(document, 'Keeper_Wave', [
      { node: arm, interpolation: 'LINEAR', times: keys.map((_, k) => k / 30), output: keys }
    ]);

    const { findings } = lintDocument(document, 'characters/keeper.glb', defaultPolicy());
    expect(rulesOf(findings)).toEqual(['unit-drift', 'hemisphere-jump']);
    expect(findings[0]).toMatchObject({
      severity: 'error',
      node: '/Keeper/Arm',
      animation: 'Keeper_Wave',
      keys: [9, 9]
    });
    expect(findings[1]).toMatchObject({
      severity: 'warning',
      node: '/Keeper/Arm',
      keys: [4, 6],
      time: expect.closeTo(4 / 30, 5)
    });
  });

  it('errs on antipodal CUBICSPLINE keys, whose curve passes through the zero quaternion', () => {
    const document = new Document();
    const buoy = document.createNode('Buoy');
    document.createScene().addChild(buoy);
    const q = axisAngle([0, 1, 0], 30);
    const zero = [0, 0, 0, 0];
    const output = [zero, q, zero, zero, q.map((c) => -c), zero];
    animate(document, 'Buoy_Bob', [{ node: buoy, interpolation: 'CUBICSPLINE', times: [0, 1], output }]);

    const { findings } = lintDocument(document, 'props/buoy.glb', defaultPolicy());
    const byRule = Object.fromEntries(findings.map((finding) => [finding.rule, finding.severity]));
    expect(byRule).toMatchObject({ 'antipodal-keys': 'error', 'hemisphere-jump': 'error', 'spline-dip': 'warning' });
  });

  it('reports a Z-up correction on the scene root, and the clip that keys the root without it', () => {
    const document = new Document();
    const armature = document.createNode('Armature').setRotation(axisAngle([1, 0, 0], -90));
    document.createScene().addChild(armature);
    const keys = [-3, 0, 3].map((degrees) => axisAngle([0, 0, 1], degrees));
    animate(document, 'Armature_Idle', [{ node: armature, interpolation: 'LINEAR', times: [0, 0.5, 1], output: keys }]);

    const { findings } = lintDocument(document, 'characters/armature.glb', defaultPolicy());
    expect(rulesOf(findings)).toEqual(['baked-basis', 'clip-basis-offset']);
    expect(findings[0].values).toMatchObject({ axis: 'X', angleDegrees: -90 });
    // The keys are the rest rotation undone: each is rest·(+90° about X) away from it (glTF 2.0 §3.4 basis).
    expect(findings[1].values).toMatchObject({ axis: 'X', angleDegrees: 90 });
  });

  it('reports a mesh node mirrored by negative scale (glTF 2.0 §3.7.4)', () => {
    const document = new Document();
    const buffer = document.createBuffer();
    const position = document
      .createAccessor()
      .setType('VEC3')
      .setArray(new Float32Array([0, 0, 0, 1, 0, 0, 0, 1, 0]))
      .setBuffer(buffer);
    const mesh = document
      .createMesh('Sail')
      .addPrimitive(document.createPrimitive().setAttribute('POSITION', position));
    const sail = document.createNode('SailL').setMesh(mesh).setScale([-1, 1, 1]);
    document.createScene().addChild(document.createNode('Boat').addChild(sail));

    const { findings } = lintDocument(document, 'props/boat.glb', defaultPolicy());
    expect(findings).toHaveLength(1);
    expect(findings[0]).toMatchObject({ rule: 'mirrored-basis', node: '/Boat/SailL', values: { meshes: 1 } });
  });

  it('reports integer rotation keys that are not marked normalized (glTF 2.0 §3.11)', () => {
    const document = new Document();
    const buffer = document.createBuffer();
    const lantern = document.createNode('Lantern');
    document.createScene().addChild(lantern);
    const input = document
      .createAccessor()
      .setType('SCALAR')
      .setArray(new Float32Array([0, 1]))
      .setBuffer(buffer);
    const output = document
      .createAccessor()
      .setType('VEC4')
      .setArray(new Int16Array([0, 0, 0, 32767, 0, 0, 0, 32767]))
      .setBuffer(buffer)
      .setNormalized(false);
    const sampler = document.createAnimationSampler().setInput(input).setOutput(output).setInterpolation('LINEAR');
    const animation = document.createAnimation('Lantern_Still').addSampler(sampler);
    animation.addChannel(
      document.createAnimationChannel().setTargetNode(lantern).setTargetPath('rotation').setSampler(sampler)
    );

    const { findings } = lintDocument(document, 'props/lantern.glb', defaultPolicy());
    expect(rulesOf(findings)).toContain('rotation-encoding');
  });

  it('stays quiet for a clean, sparsely keyed clip, and only notes redundancy for a dense steady bake', () => {
    const document = new Document();
    const gull = document.createNode('Gull');
    document.createScene().addChild(gull);
    const sparse = [0, 20, 35, 60, 70].map((degrees) => axisAngle([0, 1, 0], degrees));
    animate(document, 'Gull_Glide', [
      { node: gull, interpolation: 'LINEAR', times: [0, 0.4, 0.9, 1.2, 2], output: sparse }
    ]);
    expect(lintDocument(document, 'creatures/gull.glb', defaultPolicy()).findings).toEqual([]);

    const dense = steadyTurn([0, 1, 0], 1, 60);
    animate(document, 'Gull_Circle', [
      { node: gull, interpolation: 'LINEAR', times: dense.map((_, k) => k / 30), output: dense }
    ]);
    const { findings } = lintDocument(document, 'creatures/gull.glb', defaultPolicy());
    expect(findings).toHaveLength(1);
    expect(findings[0]).toMatchObject({
      rule: 'redundant-keys',
      severity: 'info',
      animation: 'Gull_Circle',
      values: { redundantKeys: 58 }
    });
  });

  it('checks Euler gimbal proximity only for an engine that stores Euler angles', () => {
    const document = new Document();
    const mast = document.createNode('Mast');
    document.createScene().addChild(mast);
    const keys = [0, 44, 88].map((degrees) => axisAngle([0, 1, 0], degrees));
    animate(document, 'Mast_Swing', [{ node: mast, interpolation: 'LINEAR', times: [0, 1, 2], output: keys }]);
    expect(lintDocument(document, 'props/mast.glb', defaultPolicy()).findings).toEqual([]);
    const euler = parsePolicy({ engine: { rotationStorage: 'euler', eulerOrder: 'XYZ' } });
    const { findings } = lintDocument(document, 'props/mast.glb', euler);
    expect(findings).toHaveLength(1);
    expect(findings[0]).toMatchObject({ rule: 'gimbal-proximity', keys: [2, 2] });
  });
});

describe('rules on a reference asset', () => {
  it('warns about the deliberate full turn in AnimatedTriangle at keys 3→4 and nothing else', async () => {
    const path = fileURLToPath(new URL('../../../../tests/fixtures/reference/AnimatedTriangle.gltf', import.meta.url));
    const document = await readAssetDocument({
      path: 'reference/AnimatedTriangle.gltf',
      bytes: new Uint8Array(readFileSync(path)),
      readSideFile: async () => null
    });
    const { findings } = lintDocument(document, 'reference/AnimatedTriangle.gltf', defaultPolicy());
    // MANIFEST: 1 negative-dot consecutive pair (keys 3→4, dot = −0.707); norms 0.999849013..1 stay under 1e-3.
    expect(rulesOf(findings)).toEqual(['hemisphere-jump']);
    expect(findings[0]).toMatchObject({ severity: 'warning', keys: [3, 4] });
    expect(findings[0].values.dot as number).toBeCloseTo(-0.707, 3);
  });
});

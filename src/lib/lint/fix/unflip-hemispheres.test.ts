import { Matrix4, Quaternion } from 'three';
import { describe, expect, it } from 'vitest';
import { lintDocument } from '../lint-document';
import { defaultPolicy } from '../policy';
import type { FixResult } from './fix-result';
import { unflipHemispheres } from './unflip-hemispheres';
import { addChannel, addNode, createHarborDocument, snapshotAccessors } from './sample-documents.fixture';

const policy = defaultPolicy();
const rulesOf = (document: Parameters<typeof lintDocument>[0]) =>
  lintDocument(document, 'props/crane.glb', policy).findings.map((finding) => finding.rule);

/** Rotation matrix of a stored key, from three.js as an independent oracle (q and −q give the same matrix). */
const matrixOf = (keys: ArrayLike<number>, keyIndex: number) =>
  new Matrix4().makeRotationFromQuaternion(
    new Quaternion(
      keys[keyIndex * 4],
      keys[keyIndex * 4 + 1],
      keys[keyIndex * 4 + 2],
      keys[keyIndex * 4 + 3]
    ).normalize()
  ).elements;

// Keys about Z at 0°, 60°, 120°, 180° with the last two written negated, as a sign-careless exporter does.
const c60 = Math.cos(Math.PI / 6);
const FLIPPED = new Float32Array([0, 0, 0, 1, 0, 0, 0.5, c60, 0, 0, -c60, -0.5, 0, 0, -1, 0]);

describe('unflipHemispheres', () => {
  it('negates the tail after a jump on a LINEAR channel, keeping every pose; the re-lint has no hemisphere-jump', async () => {
    const { document, animation } = createHarborDocument();
    const boom = addNode(document, 'Boom');
    const mast = addNode(document, 'Mast');
    addChannel(document, animation, {
      node: boom,
      interpolation: 'LINEAR',
      times: [0, 1, 2, 3],
      output: FLIPPED.slice()
    });
    addChannel(document, animation, {
      node: mast,
      interpolation: 'LINEAR',
      times: [0, 1],
      output: new Float32Array([0, 0, 0, 1, 0, 0.1, 0, 0.995])
    });
    expect(rulesOf(document)).toContain('hemisphere-jump');
    const before = snapshotAccessors(document);

    await document.transform(unflipHemispheres());

    expect(rulesOf(document)).not.toContain('hemisphere-jump');
    const keys = document
      .getRoot()
      .listAccessors()
      .find((a) => a.getName() === 'Boom.rotation.values')!
      .getArray()!;
    expect([...keys]).toEqual([0, 0, 0, 1, 0, 0, 0.5, c60, 0, 0, c60, 0.5, 0, 0, 1, 0].map(Math.fround));
    for (let k = 0; k < 4; k++)
      matrixOf(keys, k).forEach((value, i) => expect(value).toBeCloseTo(matrixOf(FLIPPED, k)[i], 6));
    const after = snapshotAccessors(document);
    for (const name of ['Boom.rotation.times', 'Mast.rotation.times', 'Mast.rotation.values'])
      expect(after.get(name)).toEqual(before.get(name));
  });

  it('negates CUBICSPLINE tangents with their key (the rule calls this one an error)', async () => {
    const { document, animation } = createHarborDocument();
    const hook = addNode(document, 'Hook');
    // in, value, out per key; key 1 written negated with its tangents in its own sign.
    const output = new Float32Array([
      0,
      0,
      0,
      0,
      0,
      0,
      0,
      1,
      0,
      0,
      0.3,
      0,
      0,
      0,
      -0.3,
      0,
      0,
      0,
      -0.5,
      -c60,
      0,
      0,
      -0.2,
      0.1
    ]);
    addChannel(document, animation, { node: hook, interpolation: 'CUBICSPLINE', times: [0, 1], output });
    const severities = lintDocument(document, 'props/crane.glb', policy).findings.filter(
      (f) => f.rule === 'hemisphere-jump'
    );
    expect(severities.map((f) => f.severity)).toEqual(['error']);

    await document.transform(unflipHemispheres());

    const array = document
      .getRoot()
      .listAccessors()
      .find((a) => a.getName() === 'Hook.rotation.values')!
      .getArray()!;
    expect([...array.subarray(12)]).toEqual([0, 0, 0.3, 0, 0, 0, 0.5, c60, 0, 0, 0.2, -0.1].map(Math.fround));
    expect(rulesOf(document)).not.toContain('hemisphere-jump');
  });

  it('negates quantized SHORT keys to exactly the negated codes', async () => {
    const { document, animation } = createHarborDocument();
    const gull = addNode(document, 'Gull');
    const codes = new Int16Array([0, 0, 0, 32767, 0, 23170, 0, 23170, 0, -32767, 0, 0]);
    addChannel(document, animation, {
      node: gull,
      interpolation: 'LINEAR',
      times: [0, 1, 2],
      output: codes,
      normalized: true
    });
    // 90° to 180° about Y: dot (0, √½, 0, √½)·(0, −1, 0, 0) < 0, a jump.
    await document.transform(unflipHemispheres());
    const array = document
      .getRoot()
      .listAccessors()
      .find((a) => a.getName() === 'Gull.rotation.values')!
      .getArray()!;
    expect([...array]).toEqual([0, 0, 0, 32767, 0, 23170, 0, 23170, 0, 32767, 0, 0]);
  });

  it('leaves STEP samplers alone, and clones an output a LINEAR and a STEP sampler share', async () => {
    const { document, animation } = createHarborDocument();
    const lamp = addNode(document, 'Lamp');
    const shutter = addNode(document, 'Shutter');
    const { output, input } = addChannel(document, animation, {
      node: lamp,
      interpolation: 'LINEAR',
      times: [0, 1, 2, 3],
      output: FLIPPED.slice()
    });
    const step = document.createAnimationSampler().setInput(input).setOutput(output).setInterpolation('STEP');
    animation
      .addSampler(step)
      .addChannel(document.createAnimationChannel().setTargetNode(shutter).setTargetPath('rotation').setSampler(step));
    const results: FixResult[] = [];

    await document.transform(unflipHemispheres({ onResult: (result) => results.push(result) }));

    expect(step.getOutput()).toBe(output);
    expect([...output.getArray()!]).toEqual([...FLIPPED]);
    const [linearChannel] = animation.listChannels();
    expect(linearChannel.getTargetNode()).toBe(lamp);
    expect(linearChannel.getSampler()!.getOutput()).not.toBe(output);
    expect(results[0]).toMatchObject({ keysChanged: 2, accessorsCloned: 1, accessorsWritten: 0 });
  });

  it('changes nothing when consecutive keys already share a hemisphere, and nothing on a second run', async () => {
    const { document, animation } = createHarborDocument();
    const sail = addNode(document, 'Sail');
    addChannel(document, animation, {
      node: sail,
      interpolation: 'LINEAR',
      times: [0, 1, 2, 3],
      output: FLIPPED.slice()
    });
    await document.transform(unflipHemispheres());
    const once = snapshotAccessors(document);
    const results: FixResult[] = [];
    await document.transform(unflipHemispheres({ onResult: (result) => results.push(result) }));
    expect(snapshotAccessors(document)).toEqual(once);
    expect(results).toEqual([
      { fix: 'unflipHemispheres', keysChanged: 0, nodesChanged: 0, accessorsWritten: 0, accessorsCloned: 0 }
    ]);
  });
});

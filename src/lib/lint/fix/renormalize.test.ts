import { describe, expect, it } from 'vitest';
import { lintDocument } from '../lint-document';
import { defaultPolicy } from '../policy';
import { renormalize } from './renormalize';
import type { FixResult } from './fix-result';
import {
  addChannel,
  addNode,
  axisAngleKeys,
  createHarborDocument,
  snapshotAccessors
} from './sample-documents.fixture';

const policy = defaultPolicy();
const rulesOf = (document: Parameters<typeof lintDocument>[0]) =>
  lintDocument(document, 'characters/harbor-keeper.glb', policy).findings.map((finding) => finding.rule);

/** glTF 2.0 §3.11 float → BYTE: c = round(f·127), written out here independently of the product code. */
const toByte = (f: number) => Math.sign(f) * Math.round(Math.abs(f) * 127);

describe('renormalize', () => {
  it('divides drifting float keys by their length; the re-linted asset has no unit-drift and other accessors keep their bytes', async () => {
    const { document, animation } = createHarborDocument();
    const hips = addNode(document, 'Hips');
    const spine = addNode(document, 'Spine', hips);
    const drifting = axisAngleKeys([0, 1, 0], [0, 30, 60]).map((component) => component * 1.02);
    addChannel(document, animation, { node: hips, interpolation: 'LINEAR', times: [0, 0.5, 1], output: drifting });
    addChannel(document, animation, {
      node: spine,
      interpolation: 'LINEAR',
      times: [0, 0.5, 1],
      output: axisAngleKeys([1, 0, 0], [0, 10, 20])
    });
    expect(rulesOf(document)).toContain('unit-drift');
    const before = snapshotAccessors(document);

    await document.transform(renormalize());

    expect(rulesOf(document)).not.toContain('unit-drift');
    const after = snapshotAccessors(document);
    for (const name of ['Hips.rotation.times', 'Spine.rotation.times', 'Spine.rotation.values'])
      expect(after.get(name)).toEqual(before.get(name));
    const fixed = document
      .getRoot()
      .listAccessors()
      .find((a) => a.getName() === 'Hips.rotation.values')!;
    const expected = axisAngleKeys([0, 1, 0], [0, 30, 60]); // the unit keys the drift was applied to
    [...fixed.getArray()!].forEach((value, index) => expect(value).toBeCloseTo(expected[index], 6));
  });

  it('re-quantizes a normalized BYTE output with the §3.11 formulas and keeps undrifted codes', async () => {
    const { document, animation } = createHarborDocument();
    const lantern = addNode(document, 'Lantern');
    // Key 0: (0, 0, 0, 120) decodes to length 120/127 = 0.945 (drift). Key 1: (90, 0, 0, 90) decodes to
    // length 1.0022, within the two-step BYTE tolerance (2/127) of unit-drift, so it must stay as stored.
    // Key 2: (60, 0, 0, 60), length 0.668.
    const codes = new Int8Array([0, 0, 0, 120, 90, 0, 0, 90, 60, 0, 0, 60]);
    addChannel(document, animation, {
      node: lantern,
      interpolation: 'LINEAR',
      times: [0, 1, 2],
      output: codes,
      normalized: true
    });
    expect(rulesOf(document)).toContain('unit-drift');

    await document.transform(renormalize());

    const output = document
      .getRoot()
      .listAccessors()
      .find((a) => a.getName() === 'Lantern.rotation.values')!;
    expect(output.getArray()).toBeInstanceOf(Int8Array);
    expect(output.getNormalized()).toBe(true);
    const s = Math.SQRT1_2; // (60, 0, 0, 60) / |·| = (√½, 0, 0, √½)
    expect([...output.getArray()!]).toEqual([0, 0, 0, 127, 90, 0, 0, 90, toByte(s), 0, 0, toByte(s)]);
    expect(rulesOf(document)).not.toContain('unit-drift');
  });

  it('scales CUBICSPLINE in- and out-tangents by the same factor as their key', async () => {
    const { document, animation } = createHarborDocument();
    const crane = addNode(document, 'Crane');
    // Per key: in-tangent, value, out-tangent (glTF 2.0 §3.11 CUBICSPLINE layout). Key 1 is 25% long.
    const output = new Float32Array([0, 0, 0, 0, 0, 0, 0, 1, 0, 0.1, 0, 0, 0, 0.2, 0, 0, 0, 0, 0, 1.25, 0.4, 0, 0, 0]);
    addChannel(document, animation, { node: crane, interpolation: 'CUBICSPLINE', times: [0, 1], output });

    await document.transform(renormalize());

    const array = document
      .getRoot()
      .listAccessors()
      .find((a) => a.getName() === 'Crane.rotation.values')!
      .getArray()!;
    expect([...array.subarray(0, 12)]).toEqual([...output.subarray(0, 12)]);
    const expected = [0, 0.16, 0, 0, 0, 0, 0, 1, 0.32, 0, 0, 0]; // key 1 triple divided by 1.25
    [...array.subarray(12)].forEach((value, index) => expect(value).toBeCloseTo(expected[index], 6));
  });

  it('renormalizes a drifting rest rotation and leaves one within tolerance as it is', async () => {
    const { document } = createHarborDocument();
    const buoy = addNode(document, 'Buoy', null, { rotation: [0, 0, 0.62, 0.8] }); // length 1.0121
    const bell = addNode(document, 'Bell', null, { rotation: [0, 0, 0.6, 0.8004] }); // length 1.00032
    const results: FixResult[] = [];

    await document.transform(renormalize({ onResult: (result) => results.push(result) }));

    const length = Math.hypot(0.62, 0.8);
    buoy
      .getRotation()
      .forEach((value, index) => expect(value).toBeCloseTo([0, 0, 0.62 / length, 0.8 / length][index], 12));
    expect(bell.getRotation()).toEqual([0, 0, 0.6, 0.8004]);
    expect(results).toEqual([
      { fix: 'renormalize', keysChanged: 0, nodesChanged: 1, accessorsWritten: 0, accessorsCloned: 0 }
    ]);
  });

  it('rewrites an output shared by two rotation samplers once, in place', async () => {
    const { document, animation } = createHarborDocument();
    const left = addNode(document, 'OarLeft');
    const right = addNode(document, 'OarRight');
    const { output } = addChannel(document, animation, {
      node: left,
      interpolation: 'LINEAR',
      times: [0, 1],
      output: axisAngleKeys([0, 0, 1], [0, 45]).map((c) => c * 0.97)
    });
    const sampler = document
      .createAnimationSampler()
      .setInput(document.getRoot().listAccessors()[0])
      .setOutput(output)
      .setInterpolation('LINEAR');
    animation
      .addSampler(sampler)
      .addChannel(document.createAnimationChannel().setTargetNode(right).setTargetPath('rotation').setSampler(sampler));
    const accessorCount = document.getRoot().listAccessors().length;

    await document.transform(renormalize());

    expect(document.getRoot().listAccessors()).toHaveLength(accessorCount);
    expect(sampler.getOutput()).toBe(output);
    expect(Math.hypot(...output.getArray()!.subarray(4, 8))).toBeCloseTo(1, 6);
  });

  it('clones an output that something other than a rotation sampler also reads, and leaves the original for it', async () => {
    const { document, animation } = createHarborDocument();
    const flag = addNode(document, 'Flag');
    const drifting = axisAngleKeys([0, 1, 0], [0, 90]).map((c) => c * 1.1);
    const { sampler, output } = addChannel(document, animation, {
      node: flag,
      interpolation: 'LINEAR',
      times: [0, 1],
      output: drifting
    });
    // The same accessor doubles as a vertex colour attribute (contrived, but nothing in glTF forbids it).
    const primitive = document.createPrimitive().setAttribute('COLOR_0', output);
    flag.setMesh(document.createMesh('FlagCloth').addPrimitive(primitive));
    const results: FixResult[] = [];

    await document.transform(renormalize({ onResult: (result) => results.push(result) }));

    expect(primitive.getAttribute('COLOR_0')).toBe(output);
    expect([...output.getArray()!]).toEqual([...drifting]);
    expect(sampler.getOutput()).not.toBe(output);
    expect(sampler.getOutput()!.getName()).toBe('Flag.rotation.values (fixed)');
    expect(results[0]).toMatchObject({ keysChanged: 2, accessorsWritten: 0, accessorsCloned: 1 });
  });

  it('changes nothing on a second run', async () => {
    const { document, animation } = createHarborDocument();
    const hook = addNode(document, 'Hook', null, { rotation: [0, 0.5, 0, 0.9] });
    addChannel(document, animation, {
      node: hook,
      interpolation: 'LINEAR',
      times: [0, 1],
      output: new Int16Array([0, 0, 0, 30000, 0, 20000, 0, 20000]),
      normalized: true
    });
    await document.transform(renormalize());
    const once = snapshotAccessors(document);
    const rotation = hook.getRotation();
    const results: FixResult[] = [];
    await document.transform(renormalize({ onResult: (result) => results.push(result) }));
    expect(snapshotAccessors(document)).toEqual(once);
    expect(hook.getRotation()).toEqual(rotation);
    expect(results[0]).toEqual({
      fix: 'renormalize',
      keysChanged: 0,
      nodesChanged: 0,
      accessorsWritten: 0,
      accessorsCloned: 0
    });
  });
});

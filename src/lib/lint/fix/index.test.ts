import { WebIO, type Document, type TypedArray } from '@gltf-transform/core';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { lintAsset } from '../lint-asset';
import { lintDocument } from '../lint-document';
import { defaultPolicy, parsePolicy, type Policy } from '../policy';
import type { Interpolation } from '../read/rotation-channel';
import { readAssetDocument } from '../read/read-asset-document';
import { FIXES, fixDocument, isFixable } from './index';
import { breakAntipodalKeys } from './break-antipodal-keys';
import { removeBakedBasis } from './remove-baked-basis';
import { renormalize } from './renormalize';
import { unflipHemispheres } from './unflip-hemispheres';
import {
  addChannel,
  addNode,
  axisAngleKeys,
  createHarborDocument,
  readGlbAccessorBytes,
  snapshotAccessors
} from './sample-documents.fixture';

const FIXED_RULES = ['unit-drift', 'hemisphere-jump', 'antipodal-keys', 'baked-basis', 'clip-basis-offset'];
const policy = defaultPolicy();
const rulesOf = (document: Document, under: Policy = policy) =>
  lintDocument(document, 'characters/harbor-keeper.glb', under).findings.map((finding) => finding.rule);

/** An asset with one of each fixable problem, plus clean channels that no fix may touch. */
function buildTroubledKeeper(): Document {
  const { document, animation } = createHarborDocument();
  const rig = addNode(document, 'KeeperRig', null, { rotation: [-Math.SQRT1_2, 0, 0, Math.SQRT1_2] });
  const hips = addNode(document, 'Hips', rig, { translation: [0, 0, 1] });
  const spine = addNode(document, 'Spine', hips, { translation: [0, 0.3, 0] });
  const neck = addNode(document, 'Neck', spine, { translation: [0, 0.3, 0] });
  const head = addNode(document, 'Head', neck, { translation: [0, 0.1, 0] });
  const times = [0, 0.5, 1, 1.5];
  // Hips: 3% long keys (unit-drift). Spine: a sign flip at key 2 (hemisphere-jump).
  addChannel(document, animation, {
    node: hips,
    interpolation: 'LINEAR',
    times,
    output: axisAngleKeys([0, 1, 0], [0, 10, 20, 30]).map((c) => c * 1.03)
  });
  const spineKeys = axisAngleKeys([1, 0, 0], [0, 20, 40, 60]);
  for (let index = 8; index < 16; index++) spineKeys[index] = -spineKeys[index];
  addChannel(document, animation, { node: spine, interpolation: 'LINEAR', times, output: spineKeys });
  // Neck: an antipodal pair (keys 1 and 2), CUBICSPLINE with zero tangents. Head: clean, quantized.
  const neckKeys = axisAngleKeys([0, 0, 1], [0, 15, 15, 5]);
  for (let index = 8; index < 12; index++) neckKeys[index] = -neckKeys[index];
  const cubic = new Float32Array(48);
  for (let k = 0; k < 4; k++) cubic.set(neckKeys.subarray(k * 4, k * 4 + 4), k * 12 + 4);
  addChannel(document, animation, { node: neck, interpolation: 'CUBICSPLINE', times, output: cubic });
  addChannel(document, animation, {
    node: head,
    interpolation: 'LINEAR',
    times,
    output: new Int16Array([0, 0, 0, 32767, 0, 2856, 0, 32642, 0, 5690, 0, 32269, 0, 2856, 0, 32642]),
    normalized: true
  });
  return document;
}

describe('FIXES', () => {
  it('maps each fixable rule to the transform that fixes it, and nothing else', () => {
    expect(FIXES).toEqual({
      'unit-drift': renormalize,
      'baked-basis': removeBakedBasis,
      'clip-basis-offset': removeBakedBasis,
      'hemisphere-jump': unflipHemispheres,
      'antipodal-keys': breakAntipodalKeys
    });
    expect(isFixable('not-a-rotation')).toBe(false); // a zero or NaN key has no rotation to recover
    expect(isFixable('hemisphere-jump')).toBe(true);
  });
});

describe('fixDocument', () => {
  it('fixes every fixable finding in the documented order; the re-lint has none of them', async () => {
    const document = buildTroubledKeeper();
    const before = rulesOf(document);
    for (const rule of ['unit-drift', 'hemisphere-jump', 'antipodal-keys', 'baked-basis'])
      expect(before).toContain(rule);

    const { applied, results } = await fixDocument(document, policy);

    expect(applied).toEqual(['renormalize', 'removeBakedBasis', 'unflipHemispheres']);
    expect(results.map((result) => result.fix)).toEqual([
      'renormalize',
      'removeBakedBasis',
      'unflipHemispheres',
      'breakAntipodalKeys'
    ]);
    const after = rulesOf(document);
    for (const rule of FIXED_RULES) expect(after).not.toContain(rule);
  });

  it('fixes only the rules asked for', async () => {
    const document = buildTroubledKeeper();
    const { applied } = await fixDocument(document, policy, ['unit-drift']);
    expect(applied).toEqual(['renormalize']);
    const after = rulesOf(document);
    expect(after).not.toContain('unit-drift');
    expect(after).toContain('hemisphere-jump');
    expect(after).toContain('baked-basis');
  });

  it('breaks antipodal keys on their own when hemisphere-jump is not asked for', async () => {
    const document = buildTroubledKeeper();
    const { applied } = await fixDocument(document, policy, ['antipodal-keys']);
    expect(applied).toEqual(['breakAntipodalKeys']);
    expect(rulesOf(document)).not.toContain('antipodal-keys');
  });

  it('leaves rules the policy turns off, and baked-basis when the policy does not require glTF basis', async () => {
    const relaxed = parsePolicy({ rules: { 'unit-drift': 'off' }, convention: { requireGltfBasis: false } });
    const document = buildTroubledKeeper();
    const { applied } = await fixDocument(document, relaxed);
    expect(applied).toEqual(['unflipHemispheres']);
    const after = rulesOf(document, policy);
    expect(after).toContain('unit-drift');
    expect(after).toContain('baked-basis');
  });

  it('is idempotent: a second run applies nothing and changes no byte', async () => {
    const document = buildTroubledKeeper();
    await fixDocument(document, policy);
    const once = snapshotAccessors(document);
    const { applied } = await fixDocument(document, policy);
    expect(applied).toEqual([]);
    expect(snapshotAccessors(document)).toEqual(once);
  });

  it('writes a GLB whose untouched accessors are byte-identical and which re-lints clean for the fixed rules', async () => {
    const io = new WebIO();
    const original = await io.writeBinary(buildTroubledKeeper());
    const source = { path: 'characters/harbor-keeper.glb', bytes: original, readSideFile: async () => null };
    const document = await readAssetDocument(source);
    await fixDocument(document, policy);
    const fixed = await io.writeBinary(document);

    const before = readGlbAccessorBytes(original);
    const after = readGlbAccessorBytes(fixed);
    // Touched: Hips (renormalized, then turned by the fold), Spine (unflipped). Neck's pair was unflipped too.
    const touched = new Set(['Hips.rotation.values', 'Spine.rotation.values', 'Neck.rotation.values']);
    for (const [name, bytes] of before) {
      if (touched.has(name)) expect(after.get(name), name).not.toEqual(bytes);
      else expect(after.get(name), name).toEqual(bytes);
    }
    const report = await lintAsset({ ...source, bytes: fixed }, policy);
    expect(report.findings.filter((finding) => FIXED_RULES.includes(finding.rule))).toEqual([]);
  });

  it('for any rotation channels: fixing twice equals fixing once, and the key rules find nothing after', async () => {
    const component = fc.double({ min: -1.1, max: 1.1, noNaN: true });
    const key = fc.tuple(component, component, component, component).filter((q) => Math.hypot(...q) > 0.5);
    const channel = fc.record({
      interpolation: fc.constantFrom<Interpolation>('LINEAR', 'STEP', 'CUBICSPLINE'),
      encoding: fc.constantFrom('float', 'byte', 'short'),
      keys: fc.array(key, { minLength: 2, maxLength: 8 }),
      // Negate a run of keys and duplicate one as its antipode, as sign-careless exporters do.
      flipFrom: fc.nat(8),
      antipodeAt: fc.option(fc.nat(7), { nil: null })
    });
    await fc.assert(
      fc.asyncProperty(fc.array(channel, { minLength: 1, maxLength: 3 }), async (channels) => {
        const { document, animation } = createHarborDocument();
        channels.forEach((spec, index) => {
          const keys = spec.keys.map((q, k) => (k >= spec.flipFrom ? q.map((c) => -c) : q));
          if (spec.antipodeAt !== null && spec.antipodeAt + 1 < keys.length)
            keys[spec.antipodeAt + 1] = keys[spec.antipodeAt].map((c) => -c);
          const values =
            spec.interpolation === 'CUBICSPLINE' ? keys.flatMap((q) => [0, 0, 0, 0, ...q, 0, 0, 0, 0]) : keys.flat();
          const output: TypedArray =
            spec.encoding === 'float'
              ? new Float32Array(values)
              : spec.encoding === 'byte'
                ? new Int8Array(values.map((c) => Math.max(-127, Math.min(127, Math.round(c * 127)))))
                : new Int16Array(values.map((c) => Math.max(-32767, Math.min(32767, Math.round(c * 32767)))));
          const node = addNode(document, `Node${index}`);
          addChannel(document, animation, {
            node,
            interpolation: spec.interpolation,
            times: keys.map((_, k) => k / 10),
            output,
            normalized: spec.encoding !== 'float'
          });
        });
        await fixDocument(document, policy);
        const once = snapshotAccessors(document);
        const second = await fixDocument(document, policy);
        expect(second.applied).toEqual([]);
        expect(snapshotAccessors(document)).toEqual(once);
        const after = rulesOf(document);
        for (const rule of ['unit-drift', 'hemisphere-jump', 'antipodal-keys']) expect(after).not.toContain(rule);
      }),
      { numRuns: 100 }
    );
  });
});

import { describe, expect, it } from 'vitest';
import { lintDocument } from '../lint-document';
import { defaultPolicy } from '../policy';
import { breakAntipodalKeys } from './break-antipodal-keys';
import type { FixResult } from './fix-result';
import { addChannel, addNode, createHarborDocument, snapshotAccessors } from './sample-documents.fixture';

const policy = defaultPolicy();
const findingsOf = (document: Parameters<typeof lintDocument>[0], rule: string) =>
  lintDocument(document, 'props/bell.glb', policy).findings.filter((finding) => finding.rule === rule);
const valuesOf = (document: Parameters<typeof lintDocument>[0], name: string) => [
  ...document
    .getRoot()
    .listAccessors()
    .find((a) => a.getName() === name)!
    .getArray()!
];

// (0, 0.6, 0, 0.8) is 73.74° about Y; a key of exactly its negation is the same pose (glTF 2.0 Appendix C).
const Q = [0, 0.6, 0, 0.8];
const NEG_Q = [0, -0.6, 0, -0.8];

describe('breakAntipodalKeys', () => {
  it('turns an antipodal pair into a hold of two equal keys and negates the tail with it; the re-lint is clean', async () => {
    const { document, animation } = createHarborDocument();
    const bell = addNode(document, 'Bell');
    const tail = [0, -0.5, 0, -0.866];
    addChannel(document, animation, {
      node: bell,
      interpolation: 'LINEAR',
      times: [0, 1, 2],
      output: new Float32Array([...Q, ...NEG_Q, ...tail])
    });
    expect(findingsOf(document, 'antipodal-keys')).toHaveLength(1);

    await document.transform(breakAntipodalKeys());

    expect(valuesOf(document, 'Bell.rotation.values')).toEqual([...Q, ...Q, 0, 0.5, 0, 0.866].map(Math.fround));
    expect(findingsOf(document, 'antipodal-keys')).toEqual([]);
    expect(findingsOf(document, 'hemisphere-jump')).toEqual([]); // the tail moved with key 1, so no new jump
  });

  it('keeps the time accessor and the number of keys: the second key still ends the hold', async () => {
    const { document, animation } = createHarborDocument();
    const bell = addNode(document, 'Bell');
    addChannel(document, animation, {
      node: bell,
      interpolation: 'LINEAR',
      times: [0, 1, 2],
      output: new Float32Array([...Q, ...NEG_Q, ...NEG_Q])
    });
    const before = snapshotAccessors(document);
    await document.transform(breakAntipodalKeys());
    expect(snapshotAccessors(document).get('Bell.rotation.times')).toEqual(before.get('Bell.rotation.times'));
    expect(valuesOf(document, 'Bell.rotation.values')).toHaveLength(12);
  });

  it('leaves a negative dot product that is not antipodal for unflipHemispheres', async () => {
    const { document, animation } = createHarborDocument();
    const vane = addNode(document, 'Vane');
    const output = new Float32Array([0, 0, 0, 1, 0, -0.3, 0, -0.954]);
    addChannel(document, animation, { node: vane, interpolation: 'LINEAR', times: [0, 1], output });
    const results: FixResult[] = [];
    await document.transform(breakAntipodalKeys({ onResult: (result) => results.push(result) }));
    expect(valuesOf(document, 'Vane.rotation.values')).toEqual([...output]);
    expect(results[0].keysChanged).toBe(0);
    expect(findingsOf(document, 'hemisphere-jump')).toHaveLength(1);
  });

  it('uses the policy tolerance as the rule does: a pair 0.0009 from antipodal is fixed, one 0.0011 away is not', async () => {
    // |q1 + q0| with q0 = (0, 0, 0, 1) and q1 = (0, 0, d, −1): exactly d (float32 rounding aside).
    for (const [distance, isAntipodal] of [
      [0.0009, true],
      [0.0011, false]
    ] as const) {
      const { document, animation } = createHarborDocument();
      const node = addNode(document, 'Pennant');
      addChannel(document, animation, {
        node,
        interpolation: 'CUBICSPLINE',
        times: [0, 1],
        output: new Float32Array([0, 0, 0, 0, 0, 0, 0, 1, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, distance, -1, 0, 0, 0, 0])
      });
      expect(findingsOf(document, 'antipodal-keys')).toHaveLength(isAntipodal ? 1 : 0);
      await document.transform(breakAntipodalKeys({ tolerance: policy.tolerances.antipodal }));
      expect(findingsOf(document, 'antipodal-keys')).toEqual([]);
      expect(valuesOf(document, 'Pennant.rotation.values')[19]).toBe(isAntipodal ? 1 : -1);
    }
  });

  it('leaves STEP samplers alone: nothing is interpolated between their keys', async () => {
    const { document, animation } = createHarborDocument();
    const sign = addNode(document, 'Sign');
    addChannel(document, animation, {
      node: sign,
      interpolation: 'STEP',
      times: [0, 1],
      output: new Float32Array([...Q, ...NEG_Q])
    });
    const before = snapshotAccessors(document);
    await document.transform(breakAntipodalKeys());
    expect(snapshotAccessors(document)).toEqual(before);
  });
});

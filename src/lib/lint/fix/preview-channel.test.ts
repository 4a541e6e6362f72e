import type { TypedArray } from '@gltf-transform/core';
import { describe, expect, it } from 'vitest';
import { defaultPolicy } from '../policy';
import { readRotationChannels } from '../read/read-rotation-channels';
import type { Interpolation } from '../read/rotation-channel';
import type { RuleId } from '../rule-ids';
import { fixDocument } from './index';
import { previewFixedChannel } from './preview-channel';
import { addChannel, addNode, createHarborDocument } from './sample-documents.fixture';

const policy = defaultPolicy();
const KEY_RULES: RuleId[] = ['unit-drift', 'hemisphere-jump', 'antipodal-keys'];

/** One channel read back through the reader, and the same channel after fixDocument. */
async function previewAndFix(interpolation: Interpolation, output: TypedArray, normalized = false) {
  const { document, animation } = createHarborDocument();
  const node = addNode(document, 'Mast');
  const keyCount = output.length / (interpolation === 'CUBICSPLINE' ? 12 : 4);
  addChannel(document, animation, {
    node,
    interpolation,
    times: Array.from({ length: keyCount }, (_, k) => k / 4),
    output,
    normalized
  });
  const [channel] = readRotationChannels(document);
  const valuesBefore = channel.values.slice();
  const preview = previewFixedChannel(channel, KEY_RULES, policy);
  expect(channel.values).toEqual(valuesBefore); // the input channel is not modified
  await fixDocument(document, policy, KEY_RULES);
  const [fixed] = readRotationChannels(document);
  return { preview, fixed };
}

// Keys about Y at 0°, 40°, 80°: the second 4% long, the third written negated.
const DRIFT_AND_FLIP = [0, 0, 0, 1, 0, 0.342 * 1.04, 0, 0.94 * 1.04, 0, -0.643, 0, -0.766];

describe('previewFixedChannel', () => {
  it('shows the same keys the transforms store, for a float LINEAR channel', async () => {
    const { preview, fixed } = await previewAndFix('LINEAR', new Float32Array(DRIFT_AND_FLIP));
    expect(preview.values).toEqual(fixed.values);
    expect(preview.values[9]).toBeGreaterThan(0); // key 2 flipped into key 1's hemisphere
  });

  it('shows the same keys and tangents as the transforms, for a CUBICSPLINE channel', async () => {
    const output = new Float32Array(36);
    for (let k = 0; k < 3; k++) {
      output.set(DRIFT_AND_FLIP.slice(k * 4, k * 4 + 4), k * 12 + 4);
      output.set([0, 0.1 * (k + 1), 0, 0], k * 12 + 8);
    }
    const { preview, fixed } = await previewAndFix('CUBICSPLINE', output);
    expect(preview.values).toEqual(fixed.values);
    expect(preview.inTangents).toEqual(fixed.inTangents);
    expect(preview.outTangents).toEqual(fixed.outTangents);
  });

  it('shows re-quantized values for a normalized BYTE channel, exactly as the fixed file decodes', async () => {
    const codes = new Int8Array([0, 0, 0, 127, 0, 47, 0, 124, 0, -82, 0, -97, 0, 0, 0, 110]);
    const { preview, fixed } = await previewAndFix('LINEAR', codes, true);
    expect(preview.values).toEqual(fixed.values);
  });

  it('leaves a STEP channel as it is, and ignores rules without a key fix', () => {
    const channel = {
      animation: 'Sway',
      animationIndex: 0,
      channelIndex: 0,
      nodePath: '/Mast',
      nodeIndex: 0,
      interpolation: 'STEP' as const,
      times: new Float32Array([0, 1, 2]),
      values: new Float32Array([0, 0, 0, 1, 0, 0.342, 0, 0.94, 0, -0.643, 0, -0.766]),
      inTangents: null,
      outTangents: null,
      keyCount: 3,
      raw: { inputCount: 3, outputCount: 3, outputType: 'VEC4', componentType: 5126, normalized: false },
      quantizationStep: 0,
      restRotation: [0, 0, 0, 1] as [number, number, number, number],
      isRoot: true
    };
    expect(previewFixedChannel(channel, ['hemisphere-jump', 'baked-basis', 'wide-arc']).values).toEqual(channel.values);
  });
});

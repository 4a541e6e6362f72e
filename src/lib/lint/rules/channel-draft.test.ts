import { describe, expect, it } from 'vitest';
import { channelDraft, describeKeys, describePlace } from './channel-draft';
import { channelFrom } from './testing';

describe('channel drafts', () => {
  const channel = channelFrom({
    interpolation: 'LINEAR',
    quats: [
      [0, 0, 0, 1],
      [0, 0, 0, 1],
      [0, 0, 0, 1]
    ],
    times: [0, 0.5, 1],
    animation: 'Tidewatch_Idle',
    channelIndex: 2,
    nodePath: '/Keeper/Hips'
  });

  it('names the animation, channel, node, keys and times in plain words', () => {
    expect(describePlace(channel, 1, 2)).toBe(
      'animation "Tidewatch_Idle", channel 2 (/Keeper/Hips), keys 1–2 (0.5–1 s)'
    );
    expect(describeKeys(channel, 0, 0)).toBe('key 0 (0 s)');
  });

  it('fills location fields and targets the rotation path', () => {
    const draft = channelDraft(channel, { first: 1, last: 2, values: {}, message: 'm', hint: 'h' });
    expect(draft).toMatchObject({
      animation: 'Tidewatch_Idle',
      channel: 2,
      node: '/Keeper/Hips',
      keys: [1, 2],
      time: 0.5,
      target: 'rotation'
    });
    expect(draft.severity).toBeUndefined();
  });

  it('uses the key index as fingerprint discriminator when the key has no finite time', () => {
    const broken = channelFrom({ interpolation: 'LINEAR', quats: [[0, 0, 0, 1]], times: [NaN] });
    expect(channelDraft(broken, { first: 0, last: 0, values: {}, message: 'm', hint: 'h' })).toMatchObject({
      time: null,
      target: 'rotation@key0'
    });
  });
});

import { describe, expect, test } from 'vitest';
import { createLighthouseLamp } from '../lighthouse-lamp';
import { findTrack, listRotationTracks, roundTripGlb } from '../testing';
import { nanKey } from './nan-key';

describe('nanKey', () => {
  test('turns every component of one key into NaN and keeps the others', async () => {
    const before = findTrack(listRotationTracks(createLighthouseLamp()), 'Beacon', 'Lamp Switch');
    const after = findTrack(
      listRotationTracks(
        await roundTripGlb(nanKey(createLighthouseLamp(), { animation: 'Beacon', node: 'Lamp Switch', keyIndex: 1 }))
      ),
      'Beacon',
      'Lamp Switch'
    );
    expect([...after.keys[1]].every(Number.isNaN)).toBe(true);
    expect([...after.keys[0]]).toEqual([...before.keys[0]]);
    expect([...after.keys[2]]).toEqual([...before.keys[2]]);
  });
});

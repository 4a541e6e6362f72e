import { describe, expect, test } from 'vitest';
import { createDockWindlass } from '../dock-windlass';
import { createCharacter } from '../character';
import { findTrack, listRotationTracks, roundTripGlb } from '../testing';
import { breakKeyTimes } from './break-key-times';

const isStrictlyIncreasing = (times: number[]) => times.every((t, k) => k === 0 || t > times[k - 1]);

describe('breakKeyTimes', () => {
  test('repeats the previous key time, so the input is no longer strictly increasing', async () => {
    const tracks = listRotationTracks(
      await roundTripGlb(breakKeyTimes(createDockWindlass(), { animation: 'Haul', node: 'Drum', keyIndex: 45 }))
    );
    const times = findTrack(tracks, 'Haul', 'Drum').times;
    // glTF 2.0 §3.11 (animation samplers): input times must be strictly increasing.
    expect(times[45]).toBe(times[44]);
    expect(times.filter((t, k) => k > 0 && !(t > times[k - 1]))).toHaveLength(1);
  });

  test('leaves channels that shared the time accessor untouched', async () => {
    const tracks = listRotationTracks(
      await roundTripGlb(
        breakKeyTimes(createCharacter({ name: 'Fixture' }), { animation: 'Swim', node: 'Hips', keyIndex: 10 })
      )
    );
    expect(isStrictlyIncreasing(findTrack(tracks, 'Swim', 'Hips').times)).toBe(false);
    expect(isStrictlyIncreasing(findTrack(tracks, 'Swim', 'Spine').times)).toBe(true);
  });
});

import { glMatrix } from 'gl-matrix';
import { describe, expect, test } from 'vitest';
import { createCameraRig } from '../camera-rig';
import { angleDegrees, consecutiveDots, findTrack, listRotationTracks, roundTripGlb } from '../testing';
import { gimbalFlipBake } from './gimbal-flip-bake';

glMatrix.setMatrixArrayType(Array);

const fixture = () => createCameraRig({ name: 'Fixture Cam', kind: 'crane', shot: 'Shot 010' });
const speeds = (track: ReturnType<typeof findTrack>) =>
  track.keys.slice(1).map((key, k) => angleDegrees(track.keys[k], key) / (track.times[k + 1] - track.times[k]));

describe('gimbalFlipBake', () => {
  test('whips the camera about half a turn in one frame, out and back, and nowhere else', async () => {
    const after = findTrack(
      listRotationTracks(
        await roundTripGlb(gimbalFlipBake(fixture(), { animation: 'Shot 010', node: 'Tilt', keyIndex: 70 }))
      ),
      'Shot 010',
      'Tilt'
    );
    // Angular speed from gl-matrix quat.dot angles over key intervals; 1440°/s is Orientry's default spin-spike ceiling.
    const fast = speeds(after).flatMap((speed, k) => (speed > 1440 ? [k] : []));
    expect(fast).toEqual([69, 73]);
    // 170° in 1/24 s is about 4080°/s.
    expect(speeds(after)[69]).toBeGreaterThan(3500);
    // The flip keeps a positive dot, so the trouble is speed, not hemisphere (gl-matrix quat.dot).
    expect(Math.min(...consecutiveDots(after.keys))).toBeGreaterThan(0);
  });

  test('the flipped stretch is the original turned 170° about the local axis', async () => {
    const before = findTrack(listRotationTracks(fixture()), 'Shot 010', 'Tilt');
    const after = findTrack(
      listRotationTracks(
        await roundTripGlb(
          gimbalFlipBake(fixture(), { animation: 'Shot 010', node: 'Tilt', keyIndex: 10, spanKeys: 2, axis: 'x' })
        )
      ),
      'Shot 010',
      'Tilt'
    );
    after.keys.forEach((key, k) =>
      expect(angleDegrees(key, before.keys[k])).toBeCloseTo(k === 10 || k === 11 ? 170 : 0, 3)
    );
  });

  test('refuses a stretch that runs past the last key', () => {
    expect(() => gimbalFlipBake(fixture(), { animation: 'Shot 010', node: 'Tilt', keyIndex: 143 })).toThrow(/outside/);
  });
});

import { glMatrix, quat } from 'gl-matrix';
import { describe, expect, test } from 'vitest';
import { createDockWindlass } from './dock-windlass';
import { angleDegrees, findTrack, listRotationTracks, roundTripGlb } from './testing';

glMatrix.setMatrixArrayType(Array);

describe('createDockWindlass', () => {
  test('turns the drum one full turn per haul at 30 fps', async () => {
    const drum = findTrack(
      listRotationTracks(await roundTripGlb(createDockWindlass({ haulTurnSeconds: 3 }))),
      'Haul',
      'Drum'
    );
    expect(drum.interpolation).toBe('LINEAR');
    expect(drum.keys).toHaveLength(91);
    // 360° over 90 steps is 4° per key; a full turn negates the quaternion (gl-matrix quat.dot = -1).
    expect(angleDegrees(drum.keys[0], drum.keys[1])).toBeCloseTo(4, 3);
    expect(quat.dot(drum.keys[0], drum.keys[90])).toBeCloseTo(-1, 5);
  });

  test('clicks the pawl with STEP keys every half second, alternating 0° and 14°', async () => {
    const pawl = findTrack(listRotationTracks(await roundTripGlb(createDockWindlass())), 'Haul', 'Pawl');
    expect(pawl.interpolation).toBe('STEP');
    expect(pawl.times).toEqual([0, 0.5, 1, 1.5, 2, 2.5, 3]);
    pawl.keys.forEach((key, k) => expect(angleDegrees([0, 0, 0, 1], key)).toBeCloseTo(k % 2 ? 14 : 0, 3));
  });

  test('pays out in a second clip with the drum turning the other way', async () => {
    const tracks = listRotationTracks(await roundTripGlb(createDockWindlass()));
    const payOut = findTrack(tracks, 'Pay Out', 'Drum');
    const haul = findTrack(tracks, 'Haul', 'Drum');
    // The sign of the rotation axis' x component gives the turning direction (right-hand rule).
    expect(Math.sign(payOut.keys[5][0])).toBe(-Math.sign(haul.keys[5][0]));
  });
});

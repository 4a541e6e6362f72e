import { glMatrix, quat } from 'gl-matrix';
import { describe, expect, test } from 'vitest';
import { createLighthouseLamp } from './lighthouse-lamp';
import { angleDegrees, consecutiveDots, findTrack, listRotationTracks, roundTripGlb } from './testing';

glMatrix.setMatrixArrayType(Array);

describe('createLighthouseLamp', () => {
  test('keys a full rotor turn by hand in quarter turns, each step at most 120°', async () => {
    const rotor = findTrack(listRotationTracks(await roundTripGlb(createLighthouseLamp())), 'Beacon', 'Lamp Rotor');
    expect(rotor.interpolation).toBe('LINEAR');
    expect(rotor.times).toEqual([0, 2, 4, 6, 8]);
    // Rotation angle per step via gl-matrix quat.dot: 90°, well inside the 120° the slerp path stays unambiguous for.
    for (let k = 1; k < rotor.keys.length; k++)
      expect(angleDegrees(rotor.keys[k - 1], rotor.keys[k])).toBeCloseTo(90, 4);
    // After 360° the quaternion is negated (gl-matrix quat.dot = -1): the same pose, one full turn on.
    expect(quat.dot(rotor.keys[0], rotor.keys[4])).toBeCloseTo(-1, 6);
  });

  test('bakes the rotor every frame at 30 fps when asked, 1.5° per key for an 8 s turn', async () => {
    const rotor = findTrack(
      listRotationTracks(await roundTripGlb(createLighthouseLamp({ rotorKeying: 'every-frame' }))),
      'Beacon',
      'Lamp Rotor'
    );
    expect(rotor.keys).toHaveLength(241);
    expect(angleDegrees(rotor.keys[0], rotor.keys[1])).toBeCloseTo(1.5, 3);
    expect(Math.min(...consecutiveDots(rotor.keys))).toBeGreaterThan(0.99);
  });

  test('snaps the switch lever with STEP keys: off, on, off', async () => {
    const lever = findTrack(listRotationTracks(await roundTripGlb(createLighthouseLamp())), 'Beacon', 'Lamp Switch');
    expect(lever.interpolation).toBe('STEP');
    expect(lever.times).toEqual([0, 0.5, 7.5]);
    // -35° to +35° about X: 70° apart (gl-matrix quat.dot), and back to the first pose.
    expect(angleDegrees(lever.keys[0], lever.keys[1])).toBeCloseTo(70, 4);
    expect(angleDegrees(lever.keys[0], lever.keys[2])).toBeCloseTo(0, 4);
  });
});

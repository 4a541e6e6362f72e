import { glMatrix, quat } from 'gl-matrix';
import { describe, expect, test } from 'vitest';
import { createCharacter } from '../character';
import { angleDegrees, findTrack, listRotationTracks, roundTripGlb } from '../testing';
import { clipBasisOffset } from './clip-basis-offset';

glMatrix.setMatrixArrayType(Array);

const fixture = () => createCharacter({ name: 'Fixture' });

describe('clipBasisOffset', () => {
  test('pre-multiplies every key of the channel by the basis turn', async () => {
    const before = findTrack(listRotationTracks(fixture()), 'Idle', 'Hips');
    const after = findTrack(
      listRotationTracks(await roundTripGlb(clipBasisOffset(fixture(), { animation: 'Idle', node: 'Hips' }))),
      'Idle',
      'Hips'
    );
    // Oracle: gl-matrix quat.setAxisAngle and quat.multiply (Hamilton product R·q, R applied in the parent frame).
    const turn = quat.setAxisAngle(quat.create(), [1, 0, 0], -Math.PI / 2);
    after.keys.forEach((key, k) => {
      const expected = quat.multiply(quat.create(), turn, before.keys[k]);
      key.forEach((v, i) => expect(v).toBeCloseTo(expected[i], 6));
      // The idle hips only sway a few degrees, so every key now sits within 20° of the quarter turn
      // (Orientry's default clip-basis-offset tolerance) and clearly away from rest.
      expect(angleDegrees(key, turn)).toBeLessThan(20);
      expect(angleDegrees(key, [0, 0, 0, 1])).toBeGreaterThan(70);
    });
  });

  test('turns about the axis and angle asked for', async () => {
    const after = findTrack(
      listRotationTracks(
        await roundTripGlb(
          clipBasisOffset(fixture(), { animation: 'Idle', node: 'Hips', axis: 'y', angleDegrees: 180 })
        )
      ),
      'Idle',
      'Hips'
    );
    const turn = quat.setAxisAngle(quat.create(), [0, 1, 0], Math.PI);
    for (const key of after.keys) expect(angleDegrees(key, turn)).toBeLessThan(20);
  });
});

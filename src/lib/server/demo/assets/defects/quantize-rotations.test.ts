import { glMatrix, quat } from 'gl-matrix';
import { describe, expect, test } from 'vitest';
import { createCharacter } from '../character';
import { createTideBuoy } from '../tide-buoy';
import { consecutiveDots, listRotationTracks, roundTripGlb } from '../testing';
import { quantizeRotations } from './quantize-rotations';

glMatrix.setMatrixArrayType(Array);

describe('quantizeRotations', () => {
  test('stores rotation outputs as normalized SHORT that decode back within half a step', async () => {
    const before = listRotationTracks(createTideBuoy());
    const after = listRotationTracks(await roundTripGlb(quantizeRotations(createTideBuoy())));
    after.forEach((track, t) => {
      // glTF 2.0 §3.11: componentType 5122 (SHORT), normalized; decode c / 32767.
      expect(track.componentType).toBe(5122);
      expect(track.normalized).toBe(true);
      track.keys.forEach((key, k) =>
        key.forEach((v, i) => expect(Math.abs(v - before[t].keys[k][i])).toBeLessThanOrEqual(0.5 / 32767 + 1e-9))
      );
      // Still unit within the quantization error (gl-matrix quat.length), and still continuous (quat.dot).
      for (const key of track.keys) expect(Math.abs(quat.length(key) - 1)).toBeLessThan(1e-4);
      for (const dot of consecutiveDots(track.keys)) expect(dot).toBeGreaterThan(0);
    });
  });

  test('leaves CUBICSPLINE channels as floats, since tangents may exceed 1', async () => {
    const tracks = listRotationTracks(await roundTripGlb(quantizeRotations(createCharacter({ name: 'Fixture' }))));
    for (const track of tracks) expect(track.componentType).toBe(track.interpolation === 'CUBICSPLINE' ? 5126 : 5122);
  });

  test('quantizes only the named animation when asked', async () => {
    const tracks = listRotationTracks(
      await roundTripGlb(quantizeRotations(createCharacter({ name: 'Fixture' }), { animation: 'Wave' }))
    );
    for (const track of tracks) expect(track.normalized).toBe(track.animation === 'Wave');
  });
});

import { glMatrix, quat } from 'gl-matrix';
import { describe, expect, test } from 'vitest';
import { createCharacter } from '../character';
import { DemoAssetError } from '../demo-asset-error';
import { angleDegrees, findTrack, listRotationTracks, roundTripGlb } from '../testing';
import { redundantKeys } from './redundant-keys';

glMatrix.setMatrixArrayType(Array);

const fixture = () => createCharacter({ name: 'Fixture' });

describe('redundantKeys', () => {
  test('inserts slerp midpoints that interpolation of their neighbours already reproduces', async () => {
    const before = findTrack(listRotationTracks(fixture()), 'Wave', 'Hand.R');
    const after = findTrack(
      listRotationTracks(
        await roundTripGlb(redundantKeys(fixture(), { animation: 'Wave', node: 'Hand.R', fromKey: 10, count: 3 }))
      ),
      'Wave',
      'Hand.R'
    );
    expect(after.keys).toHaveLength(before.keys.length + 3);
    for (const inserted of [11, 13, 15]) {
      const [previous, next] = [after.keys[inserted - 1], after.keys[inserted + 1]];
      expect(after.times[inserted]).toBeCloseTo((after.times[inserted - 1] + after.times[inserted + 1]) / 2, 6);
      // Oracle: gl-matrix quat.slerp at the midpoint (glTF 2.0 Appendix C); within Orientry's 0.01° redundancy tolerance.
      expect(angleDegrees(after.keys[inserted], quat.slerp(quat.create(), previous, next, 0.5))).toBeLessThan(0.01);
    }
    // The original keys keep their values and order around the inserted ones.
    expect(angleDegrees(after.keys[16], before.keys[13])).toBeLessThan(1e-6);
  });

  test('refuses a CUBICSPLINE channel, where a midpoint would need tangents too', () => {
    expect(() => redundantKeys(fixture(), { animation: 'Tread', node: 'Hips', fromKey: 2 })).toThrow(DemoAssetError);
  });
});

import { glMatrix, quat } from 'gl-matrix';
import { describe, expect, test } from 'vitest';
import { createCharacter } from '../character';
import { DemoAssetError } from '../demo-asset-error';
import { angleDegrees, findTrack, listRotationTracks, roundTripGlb } from '../testing';
import { redundantKeys } from './redundant-keys';

glMatrix.setMatrixArrayType(Array);

const fixture = () => createCharacter({ name: 'Fixture' });

describe('redundantKeys', () => {
  test('inserts a run of keys that interpolating their own neighbours already reproduces', async () => {
    const before = findTrack(listRotationTracks(fixture()), 'Wave', 'Hand.R');
    const after = findTrack(
      listRotationTracks(
        await roundTripGlb(redundantKeys(fixture(), { animation: 'Wave', node: 'Hand.R', afterKey: 10, count: 5 }))
      ),
      'Wave',
      'Hand.R'
    );
    expect(after.keys).toHaveLength(before.keys.length + 5);
    for (let inserted = 11; inserted <= 15; inserted++) {
      const [previous, next] = [after.keys[inserted - 1], after.keys[inserted + 1]];
      const fraction =
        (after.times[inserted] - after.times[inserted - 1]) / (after.times[inserted + 1] - after.times[inserted - 1]);
      // Oracle: gl-matrix quat.slerp of the neighbours at the key's time (glTF 2.0 Appendix C);
      // within Orientry's default 0.01° redundancy tolerance.
      expect(angleDegrees(after.keys[inserted], quat.slerp(quat.create(), previous, next, fraction))).toBeLessThan(
        0.01
      );
      expect(after.times[inserted]).toBeGreaterThan(after.times[inserted - 1]);
    }
    // The original keys keep their values around the run.
    expect(angleDegrees(after.keys[10], before.keys[10])).toBeLessThan(1e-6);
    expect(angleDegrees(after.keys[16], before.keys[11])).toBeLessThan(1e-6);
    expect(after.times[16]).toBe(before.times[11]);
  });

  test('refuses a CUBICSPLINE channel, where new keys would need tangents too', () => {
    expect(() => redundantKeys(fixture(), { animation: 'Tread', node: 'Hips', afterKey: 2 })).toThrow(DemoAssetError);
  });

  test('refuses the last key, which has no gap after it', () => {
    expect(() => redundantKeys(fixture(), { animation: 'Wave', node: 'Hand.R', afterKey: 60 })).toThrow(/outside/);
  });
});

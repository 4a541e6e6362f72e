import { glMatrix, quat } from 'gl-matrix';
import { describe, expect, test } from 'vitest';
import { createCharacter } from '../character';
import { DemoAssetError } from '../demo-asset-error';
import { findTrack, listRotationTracks, roundTripGlb } from '../testing';
import { driftLength } from './drift-length';

glMatrix.setMatrixArrayType(Array);

const fixture = () => createCharacter({ name: 'Fixture' });

describe('driftLength', () => {
  test('scales every key of the channel to the given length (1.003: beyond the 1e-3 warning, within the 1e-2 error)', async () => {
    const tracks = listRotationTracks(
      await roundTripGlb(driftLength(fixture(), { animation: 'Idle', node: 'Head', factor: 1.003 }))
    );
    for (const key of findTrack(tracks, 'Idle', 'Head').keys) {
      // Oracle: gl-matrix quat.length; thresholds are Orientry's default policy tolerances (unitWarning 1e-3, unitError 1e-2).
      expect(quat.length(key)).toBeCloseTo(1.003, 6);
      expect(Math.abs(quat.length(key) - 1)).toBeGreaterThan(1e-3);
      expect(Math.abs(quat.length(key) - 1)).toBeLessThan(1e-2);
    }
    for (const key of findTrack(tracks, 'Idle', 'Neck').keys) expect(quat.length(key)).toBeCloseTo(1, 6);
  });

  test('limits the drift to a key range and leaves the other keys unit', async () => {
    const tracks = listRotationTracks(
      await roundTripGlb(
        driftLength(fixture(), { animation: 'Idle', node: 'Spine', factor: 1.02, fromKey: 40, toKey: 70 })
      )
    );
    // Oracle: gl-matrix quat.length; 1.02 lies beyond the default 1e-2 error tolerance.
    findTrack(tracks, 'Idle', 'Spine').keys.forEach((key, k) =>
      expect(quat.length(key)).toBeCloseTo(k >= 40 && k <= 70 ? 1.02 : 1, 6)
    );
  });

  test('scales CUBICSPLINE tangents with their keys, so only the length changes', async () => {
    const original = findTrack(listRotationTracks(fixture()), 'Tread', 'Hips');
    const drifted = findTrack(
      listRotationTracks(
        await roundTripGlb(driftLength(fixture(), { animation: 'Tread', node: 'Hips', factor: 1.02 }))
      ),
      'Tread',
      'Hips'
    );
    drifted.outTangents.forEach((tangent, k) =>
      tangent.forEach((v, i) => expect(v).toBeCloseTo(original.outTangents[k][i] * 1.02, 6))
    );
  });

  test('refuses a missing channel and a key range outside the channel', () => {
    expect(() => driftLength(fixture(), { animation: 'Idle', node: 'Tail', factor: 1.02 })).toThrow(DemoAssetError);
    expect(() => driftLength(fixture(), { animation: 'Idle', node: 'Head', factor: 1.02, toKey: 500 })).toThrow(
      /outside/
    );
  });
});

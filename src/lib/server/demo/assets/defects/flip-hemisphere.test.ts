import { glMatrix } from 'gl-matrix';
import { describe, expect, test } from 'vitest';
import { createCharacter } from '../character';
import { angleDegrees, consecutiveDots, findTrack, listRotationTracks, roundTripGlb } from '../testing';
import { flipHemisphere } from './flip-hemisphere';

glMatrix.setMatrixArrayType(Array);

const fixture = () => createCharacter({ name: 'Fixture', swimStyle: 'crawl' });

describe('flipHemisphere', () => {
  test('leaves exactly one negative dot, between keys fromKey - 1 and fromKey', async () => {
    const before = findTrack(listRotationTracks(fixture()), 'Swim', 'UpperArm.L');
    const after = findTrack(
      listRotationTracks(
        await roundTripGlb(flipHemisphere(fixture(), { animation: 'Swim', node: 'UpperArm.L', fromKey: 31 }))
      ),
      'Swim',
      'UpperArm.L'
    );
    // Oracle: gl-matrix quat.dot; glTF 2.0 Appendix C: a negative dot means opposite hemispheres.
    const negative = consecutiveDots(after.keys).flatMap((dot, k) => (dot < 0 ? [k] : []));
    expect(negative).toEqual([30]);
    // Every key still holds the same pose (q and -q rotate alike): 0° apart, sign-blind.
    after.keys.forEach((key, k) => expect(angleDegrees(key, before.keys[k])).toBeLessThan(1e-3));
  });

  test('negates CUBICSPLINE tangents with their keys', async () => {
    const before = findTrack(listRotationTracks(fixture()), 'Tread', 'Thigh.L');
    const after = findTrack(
      listRotationTracks(
        await roundTripGlb(flipHemisphere(fixture(), { animation: 'Tread', node: 'Thigh.L', fromKey: 5 }))
      ),
      'Tread',
      'Thigh.L'
    );
    expect(consecutiveDots(after.keys).flatMap((dot, k) => (dot < 0 ? [k] : []))).toEqual([4]);
    after.inTangents.forEach((tangent, k) =>
      tangent.forEach((v, i) => expect(v).toBeCloseTo((k >= 5 ? -1 : 1) * before.inTangents[k][i], 6))
    );
  });

  test('refuses to flip from the first key, which has no predecessor to jump from', () => {
    expect(() => flipHemisphere(fixture(), { animation: 'Swim', node: 'UpperArm.L', fromKey: 0 })).toThrow(/outside/);
  });
});

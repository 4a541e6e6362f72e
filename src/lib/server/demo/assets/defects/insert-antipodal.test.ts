import { glMatrix, quat } from 'gl-matrix';
import { describe, expect, test } from 'vitest';
import { createCharacter } from '../character';
import { findTrack, listRotationTracks, roundTripGlb } from '../testing';
import { insertAntipodal } from './insert-antipodal';

glMatrix.setMatrixArrayType(Array);

const fixture = () => createCharacter({ name: 'Fixture' });

describe('insertAntipodal', () => {
  test('makes key k + 1 the exact negation of key k and changes no other key', async () => {
    const before = findTrack(listRotationTracks(fixture()), 'Wave', 'Forearm.R');
    const after = findTrack(
      listRotationTracks(
        await roundTripGlb(insertAntipodal(fixture(), { animation: 'Wave', node: 'Forearm.R', keyIndex: 20 }))
      ),
      'Wave',
      'Forearm.R'
    );
    // Oracle: gl-matrix quat.dot; a dot of -1 between unit keys is the antipodal case (glTF 2.0 Appendix C slerp is undefined there).
    expect(quat.dot(after.keys[20], after.keys[21])).toBeCloseTo(-1, 6);
    after.keys.forEach((key, k) => {
      if (k !== 21) key.forEach((v, i) => expect(v).toBe(before.keys[k][i]));
    });
  });

  test('refuses the last key, which has no key after it', () => {
    expect(() => insertAntipodal(fixture(), { animation: 'Wave', node: 'Forearm.R', keyIndex: 60 })).toThrow(/outside/);
  });
});

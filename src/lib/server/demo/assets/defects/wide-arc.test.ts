import { glMatrix, quat } from 'gl-matrix';
import { describe, expect, test } from 'vitest';
import { createCharacter } from '../character';
import { DemoAssetError } from '../demo-asset-error';
import { angleDegrees, findTrack, listRotationTracks, roundTripGlb } from '../testing';
import { wideArc } from './wide-arc';

glMatrix.setMatrixArrayType(Array);

const fixture = () => createCharacter({ name: 'Fixture', swimStyle: 'crawl' });
const steps = (keys: quat[]) => keys.slice(1).map((key, k) => angleDegrees(keys[k], key));

describe('wideArc', () => {
  test('leaves one step of nearly 170° from the chosen key, still with a positive dot', async () => {
    const before = findTrack(listRotationTracks(fixture()), 'Swim', 'UpperArm.L');
    const after = findTrack(
      listRotationTracks(await roundTripGlb(wideArc(fixture(), { animation: 'Swim', node: 'UpperArm.L', fromKey: 5 }))),
      'Swim',
      'UpperArm.L'
    );
    // Rotation angles from gl-matrix quat.dot: one step above Orientry's default 150° wide-arc limit, none other.
    const wide = steps(after.keys).flatMap((angle, k) => (angle > 150 ? [k] : []));
    expect(wide).toEqual([5]);
    expect(steps(after.keys)[5]).toBeLessThanOrEqual(170);
    expect(steps(after.keys)[5]).toBeGreaterThan(160);
    expect(quat.dot(after.keys[5], after.keys[6])).toBeGreaterThan(0);
    expect(after.keys.length).toBeLessThan(before.keys.length);
    expect(after.times[6] - after.times[5]).toBeGreaterThan(0.4);
  });

  test('honours a custom arc', async () => {
    const after = findTrack(
      listRotationTracks(
        await roundTripGlb(wideArc(fixture(), { animation: 'Swim', node: 'UpperArm.L', fromKey: 0, arcDegrees: 120 }))
      ),
      'Swim',
      'UpperArm.L'
    );
    expect(steps(after.keys)[0]).toBeLessThanOrEqual(120);
    expect(steps(after.keys)[0]).toBeGreaterThan(110);
  });

  test('refuses a channel that never turns that far', () => {
    expect(() => wideArc(fixture(), { animation: 'Idle', node: 'Head', fromKey: 5 })).toThrow(DemoAssetError);
  });
});

import { glMatrix } from 'gl-matrix';
import { describe, expect, test } from 'vitest';
import { createTideBuoy } from './tide-buoy';
import { angleDegrees, findTrack, listRotationTracks, roundTripGlb } from './testing';

glMatrix.setMatrixArrayType(Array);

describe('createTideBuoy', () => {
  test('bobs and tilts the whole buoy from its scene root', async () => {
    const document = await roundTripGlb(createTideBuoy({ swellMetres: 0.4, tiltDegrees: 10 }));
    const [swell] = document.getRoot().listAnimations();
    const paths = swell
      .listChannels()
      .map((channel) => `${channel.getTargetNode()?.getName()}.${channel.getTargetPath()}`);
    expect(paths).toEqual(['Tide Buoy.translation', 'Tide Buoy.rotation', 'Bell Clapper.rotation']);
    const translation = swell.listChannels()[0].getSampler()!.getOutput()!;
    const heights = Array.from({ length: translation.getCount() }, (_, k) => translation.getElement(k, [])[1]);
    // A sine of 0.2 m amplitude (half the crest-to-trough swell), sampled 30 times a second.
    expect(Math.max(...heights)).toBeCloseTo(0.2, 3);
    expect(Math.min(...heights)).toBeCloseTo(-0.2, 3);
  });

  test('keeps the tilt within the requested angle (two axes combined stay within their sum)', async () => {
    const tilt = findTrack(
      listRotationTracks(await roundTripGlb(createTideBuoy({ tiltDegrees: 8 }))),
      'Swell',
      'Tide Buoy'
    );
    // Composed X (8°) and Z (4.8°) tilts: the total rotation angle cannot exceed 12.8° (triangle inequality on SO(3)).
    const largest = Math.max(...tilt.keys.map((key) => angleDegrees([0, 0, 0, 1], key)));
    expect(largest).toBeGreaterThan(7);
    expect(largest).toBeLessThan(12.8);
  });
});

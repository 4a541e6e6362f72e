import { glMatrix, quat } from 'gl-matrix';
import { describe, expect, test } from 'vitest';
import { addKeyedTrack, addSampledClip } from './animation-clip';
import { createDemoDocument } from './demo-document';
import { findTrack, listRotationTracks, roundTripGlb } from './testing';

glMatrix.setMatrixArrayType(Array);

/** A rotation about Y by θ(t) = sin(t) radians, with its exact derivative. */
const angle = (t: number) => Math.sin(t);
const rotation = (t: number) => [0, Math.sin(angle(t) / 2), 0, Math.cos(angle(t) / 2)];
// d/dt (0, sin(θ/2), 0, cos(θ/2)) = θ'/2 · (0, cos(θ/2), 0, -sin(θ/2)), θ' = cos t (calculus, chain rule).
const derivative = (t: number) => [
  0,
  (Math.cos(t) / 2) * Math.cos(angle(t) / 2),
  0,
  (-Math.cos(t) / 2) * Math.sin(angle(t) / 2)
];

function documentWith(interpolation: 'LINEAR' | 'CUBICSPLINE', keysPerSecond: number) {
  const document = createDemoDocument('Clip test');
  const node = document.createNode('Bone');
  document.getRoot().listScenes()[0].addChild(node);
  addSampledClip(document, {
    name: 'Test',
    durationSeconds: 2,
    interpolation,
    keysPerSecond,
    tracks: [{ node, path: 'rotation', sample: rotation }]
  });
  return document;
}

/** The glTF 2.0 Appendix C cubic Hermite spline between keys k and k + 1 at fraction s. */
function hermite(v0: number[], b0: number[], v1: number[], a1: number[], intervalSeconds: number, s: number): number[] {
  const s2 = s * s;
  const s3 = s2 * s;
  return v0.map(
    (_, i) =>
      (2 * s3 - 3 * s2 + 1) * v0[i] +
      intervalSeconds * (s3 - 2 * s2 + s) * b0[i] +
      (-2 * s3 + 3 * s2) * v1[i] +
      intervalSeconds * (s3 - s2) * a1[i]
  );
}

describe('addSampledClip', () => {
  test('bakes LINEAR keys at the requested rate from the function', async () => {
    const track = findTrack(listRotationTracks(await roundTripGlb(documentWith('LINEAR', 30))), 'Test', 'Bone');
    expect(track.interpolation).toBe('LINEAR');
    expect(track.times).toHaveLength(61);
    track.times.forEach((t, k) => expect(t).toBeCloseTo(k / 30, 6));
    track.keys.forEach((key, k) => rotation(k / 30).forEach((v, i) => expect(key[i]).toBeCloseTo(v, 6)));
  });

  test('stores CUBICSPLINE tangents equal to the time derivative of the function', async () => {
    const track = findTrack(listRotationTracks(await roundTripGlb(documentWith('CUBICSPLINE', 4))), 'Test', 'Bone');
    expect(track.interpolation).toBe('CUBICSPLINE');
    expect(track.keys).toHaveLength(9);
    track.times.forEach((t, k) => {
      // Tangents are in units per second (glTF 2.0 Appendix C multiplies them by the key interval).
      derivative(t).forEach((v, i) => expect(track.inTangents[k][i]).toBeCloseTo(v, 5));
      derivative(t).forEach((v, i) => expect(track.outTangents[k][i]).toBeCloseTo(v, 5));
    });
  });

  test('the spline through those tangents follows the function between keys', async () => {
    const track = findTrack(listRotationTracks(await roundTripGlb(documentWith('CUBICSPLINE', 4))), 'Test', 'Bone');
    for (let k = 0; k + 1 < track.keys.length; k++) {
      const interval = track.times[k + 1] - track.times[k];
      const mid = hermite(
        [...track.keys[k]],
        [...track.outTangents[k]],
        [...track.keys[k + 1]],
        [...track.inTangents[k + 1]],
        interval,
        0.5
      );
      // Hermite error is O(h⁴); 1e-3 is far below a visible difference and far above float32 noise (common practice).
      rotation(track.times[k] + interval / 2).forEach((v, i) => expect(Math.abs(mid[i] - v)).toBeLessThan(1e-3));
      // Oracle: gl-matrix quat.length; the spline keeps unit length within 1e-3, no dip between keys.
      expect(Math.abs(quat.length(quat.fromValues(mid[0], mid[1], mid[2], mid[3])) - 1)).toBeLessThan(1e-3);
    }
  });
});

describe('addKeyedTrack', () => {
  test('writes hand keys with their own time accessor and the interpolation asked for', async () => {
    const document = createDemoDocument('Keyed');
    const node = document.createNode('Lever');
    document.getRoot().listScenes()[0].addChild(node);
    const animation = document.createAnimation('Flip');
    addKeyedTrack(document, animation, {
      node,
      path: 'rotation',
      interpolation: 'STEP',
      times: [0, 1],
      values: [
        [0, 0, 0, 1],
        [1, 0, 0, 0]
      ]
    });
    const track = findTrack(listRotationTracks(await roundTripGlb(document)), 'Flip', 'Lever');
    expect(track.interpolation).toBe('STEP');
    expect(track.times).toEqual([0, 1]);
    expect(track.keys.map((key) => [...key])).toEqual([
      [0, 0, 0, 1],
      [1, 0, 0, 0]
    ]);
  });
});

import { glMatrix, quat } from 'gl-matrix';
import { describe, expect, test } from 'vitest';
import { createCameraRig } from './camera-rig';
import { findTrack, listRotationTracks, roundTripGlb } from './testing';

glMatrix.setMatrixArrayType(Array);

const KINDS = ['crane', 'dolly', 'orbit'] as const;

describe.each(KINDS)('createCameraRig (%s)', (kind) => {
  test('mounts a perspective camera under separate tilt and pan nodes', async () => {
    const document = await roundTripGlb(createCameraRig({ name: 'Test Cam', kind, shot: 'Shot 900' }));
    const cameraNode = document
      .getRoot()
      .listNodes()
      .find((node) => node.getCamera() !== null);
    expect(cameraNode?.getName()).toBe('Camera');
    expect(cameraNode?.getParentNode()?.getName()).toBe('Tilt');
    expect(cameraNode?.getParentNode()?.getParentNode()?.getName()).toBe('Pan');
    const camera = cameraNode!.getCamera()!;
    expect(camera.getType()).toBe('perspective');
    expect(camera.getAspectRatio()).toBeCloseTo(16 / 9, 6);
  });

  test('animates pan and tilt with 24 fps LINEAR rotation channels', async () => {
    const tracks = listRotationTracks(
      await roundTripGlb(createCameraRig({ name: 'Test Cam', kind, shot: 'Shot 900' }))
    );
    for (const node of ['Pan', 'Tilt']) {
      const track = findTrack(tracks, 'Shot 900', node);
      expect(track.interpolation).toBe('LINEAR');
      expect(track.keys).toHaveLength(6 * 24 + 1);
      track.times.forEach((t, k) => expect(t).toBeCloseTo(k / 24, 5));
    }
  });
});

describe('createCameraRig', () => {
  test('the orbit pivot circles one full turn over the shot', async () => {
    const tracks = listRotationTracks(
      await roundTripGlb(createCameraRig({ name: 'Orbit', kind: 'orbit', shot: 'Shot 020', durationSeconds: 10 }))
    );
    const pivot = findTrack(tracks, 'Shot 020', 'Orbit Pivot');
    // A full turn negates the quaternion (gl-matrix quat.dot = -1).
    expect(quat.dot(pivot.keys[0], pivot.keys[pivot.keys.length - 1])).toBeCloseTo(-1, 5);
  });

  test('the dolly rig moves its cart instead of rotating a pivot', async () => {
    const document = await roundTripGlb(createCameraRig({ name: 'Dolly', kind: 'dolly', shot: 'Shot 030' }));
    const channels = document.getRoot().listAnimations()[0].listChannels();
    expect(channels.map((channel) => `${channel.getTargetNode()?.getName()}.${channel.getTargetPath()}`)).toEqual([
      'Dolly Cart.translation',
      'Pan.rotation',
      'Tilt.rotation'
    ]);
  });
});

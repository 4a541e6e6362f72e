import { glMatrix, mat4, quat } from 'gl-matrix';
import { describe, expect, test } from 'vitest';
import { toGlb } from './asset-files';
import { createCharacter } from './character';
import { HUMANOID_JOINTS } from './humanoid-rig';
import { angleDegrees, findTrack, listRotationTracks, roundTripGlb } from './testing';

glMatrix.setMatrixArrayType(Array);

describe('createCharacter', () => {
  test('builds an 18-joint skin whose inverse bind matrices undo each joint’s bind pose', async () => {
    const document = await roundTripGlb(createCharacter({ name: 'Kelp Diver' }));
    const [skin] = document.getRoot().listSkins();
    const joints = skin.listJoints();
    expect(joints.map((joint) => joint.getName())).toEqual([...HUMANOID_JOINTS]);
    const inverseBind = skin.getInverseBindMatrices();
    expect(inverseBind?.getType()).toBe('MAT4');
    expect(inverseBind?.getCount()).toBe(18);
    joints.forEach((joint, j) => {
      const ibm = Array.from(inverseBind!.getElement(j, []));
      // glTF 2.0 §3.7.3: inverse bind matrix × joint world matrix at bind = identity (column-major, gl-matrix mat4.multiply).
      const product = mat4.multiply(mat4.create(), ibm as unknown as mat4, joint.getWorldMatrix() as unknown as mat4);
      Array.from(product).forEach((v, i) => expect(v).toBeCloseTo(i % 5 === 0 ? 1 : 0, 5));
    });
    expect(skin.getSkeleton()?.getName()).toBe('Hips');
  });

  test('weights every vertex fully to one joint (glTF 2.0 §3.7.3.2: weights sum to 1)', async () => {
    const document = await roundTripGlb(createCharacter({ name: 'Harbor Warden' }));
    const primitive = document.getRoot().listMeshes()[0].listPrimitives()[0];
    const weights = primitive.getAttribute('WEIGHTS_0')!;
    const joints = primitive.getAttribute('JOINTS_0')!;
    for (let v = 0; v < weights.getCount(); v++) {
      const w = weights.getElement(v, []);
      expect(w.reduce((sum, x) => sum + x, 0)).toBeCloseTo(1, 6);
      expect(joints.getElement(v, [])[0]).toBeLessThan(18);
    }
  });

  test('has Idle, Swim and Wave as 30 fps LINEAR loops and Tread as a CUBICSPLINE clip', async () => {
    const tracks = listRotationTracks(await roundTripGlb(createCharacter({ name: 'Kelp Diver', swimStyle: 'crawl' })));
    const clips = new Map(tracks.map((track) => [track.animation, track.interpolation]));
    expect(Object.fromEntries(clips)).toEqual({ Idle: 'LINEAR', Swim: 'LINEAR', Wave: 'LINEAR', Tread: 'CUBICSPLINE' });
    for (const track of tracks.filter((t) => t.interpolation === 'LINEAR')) {
      track.times.forEach((t, k) => expect(t).toBeCloseTo(k / 30, 5));
      // A loop ends on its first pose: rotation angle between first and last key below 0.01° (gl-matrix quat.dot).
      expect(angleDegrees(track.keys[0], track.keys[track.keys.length - 1])).toBeLessThan(0.01);
    }
  });

  test('the crawl windmills each upper arm one full turn per 2 s cycle', async () => {
    const tracks = listRotationTracks(await roundTripGlb(createCharacter({ name: 'Kelp Diver', swimStyle: 'crawl' })));
    const arm = findTrack(tracks, 'Swim', 'UpperArm.L');
    // A full turn returns to the negated quaternion (-q is q turned by 360°), reached through 60 small steps.
    expect(quat.dot(arm.keys[0], arm.keys[60])).toBeCloseTo(-1, 5);
    const steps = arm.keys.slice(1).map((key, k) => angleDegrees(arm.keys[k], key));
    expect(Math.max(...steps)).toBeLessThan(10);
  });

  test('the breaststroke never turns an arm more than a half turn', async () => {
    const tracks = listRotationTracks(await roundTripGlb(createCharacter({ name: 'Kelp Diver' })));
    const arm = findTrack(tracks, 'Swim', 'UpperArm.L');
    for (const key of arm.keys) expect(quat.dot(arm.keys[0], key)).toBeGreaterThan(0);
  });

  test('parents a held prop to the right hand', async () => {
    const document = await roundTripGlb(createCharacter({ name: 'Lamp Keeper', heldProp: 'lantern' }));
    const lantern = document
      .getRoot()
      .listNodes()
      .find((node) => node.getName() === 'Lantern');
    expect(lantern?.getParentNode()?.getName()).toBe('Hand.R');
    expect(lantern?.getMesh()).not.toBeNull();
  });

  test('amplitudeScale widens the swings without changing the rig', async () => {
    const calm = listRotationTracks(await roundTripGlb(createCharacter({ name: 'Kelp Diver', amplitudeScale: 0.5 })));
    const lively = listRotationTracks(await roundTripGlb(createCharacter({ name: 'Kelp Diver', amplitudeScale: 1.5 })));
    const range = (tracks: typeof calm) => {
      const head = findTrack(tracks, 'Idle', 'Head');
      return Math.max(...head.keys.map((key) => angleDegrees(head.keys[0], key)));
    };
    expect(range(lively)).toBeGreaterThan(range(calm) * 1.5);
  });

  test('a character file is tens of kilobytes', async () => {
    const byteLength = (await toGlb(createCharacter({ name: 'Kelp Diver', swimStyle: 'crawl', heldProp: 'boathook' })))
      .byteLength;
    expect(byteLength).toBeGreaterThan(10_000);
    expect(byteLength).toBeLessThan(100_000);
  });
});

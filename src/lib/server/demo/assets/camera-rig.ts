/**
 * Cinematic camera rigs: a camera node at the end of a dolly or crane hierarchy with separate
 * pan (Y) and tilt (X) nodes, the way layout artists build them so each axis gets its own curve.
 * Shots are baked at 24 fps, the studio's cinematic rate.
 */
import type { Document, Node } from '@gltf-transform/core';
import { addSampledClip, rotationTrack, type SampledTrack } from './animation-clip';
import { createDemoDocument } from './demo-document';
import { addShapeMesh, box } from './mesh-shape';
import type { AngleCurve } from './rotation-curve';

/** Keys per second of the cinematic bakes. */
export const CINEMATIC_FRAMES_PER_SECOND = 24;

/** Options for {@link createCameraRig}. */
export interface CameraRigOptions {
  /** Rig name, e.g. `Dock Crane Cam`; also the camera object's name. */
  name: string;
  /**
   * `crane`: base → swinging arm → boom → pan → tilt → camera.
   * `dolly`: track with a translating cart → pan → tilt → camera.
   * `orbit`: a pivot that circles a full turn → pan → tilt → camera, for flyarounds.
   */
  kind: 'crane' | 'dolly' | 'orbit';
  /** Shot name (the animation), e.g. `Shot 010`. */
  shot: string;
  durationSeconds?: number;
  /** Pan sweep in degrees, end to end (40 by default). */
  panSweepDegrees?: number;
  /** Resting tilt in degrees; negative looks down (-12 by default). */
  tiltDegrees?: number;
}

/** Builds a camera rig document with one shot; pure, so equal options give equal bytes. */
export function createCameraRig(options: CameraRigOptions): Document {
  const durationSeconds = options.durationSeconds ?? 6;
  const sweep = options.panSweepDegrees ?? 40;
  const tilt = options.tiltDegrees ?? -12;
  const document = createDemoDocument(options.name);
  const scene = document.getRoot().listScenes()[0];
  const root = document
    .createNode(`${options.name} Rig`)
    .setMesh(addShapeMesh(document, 'Rig Base', box([0.8, 0.2, 0.8], [0, 0.1, 0])));
  scene.addChild(root);
  // A half sine over the shot eases the move in and out, as a layout artist's curve would.
  const ease = 1 / (2 * durationSeconds);
  const tracks: SampledTrack[] = [];
  let mount: Node;
  if (options.kind === 'crane') {
    const arm = document.createNode('Crane Arm').setTranslation([0, 1.2, 0]);
    const boom = document.createNode('Boom').setTranslation([0, 0, 3.5]);
    root.addChild(arm);
    arm.addChild(boom);
    tracks.push(rotationTrack(arm, [{ axis: 'y', amplitudeDegrees: -25, frequencyHz: ease, phaseTurns: 0.75 }]));
    tracks.push(rotationTrack(boom, [{ axis: 'x', offsetDegrees: -10, amplitudeDegrees: 12, frequencyHz: ease }]));
    mount = boom;
  } else if (options.kind === 'dolly') {
    const cart = document.createNode('Dolly Cart').setTranslation([0, 0.3, 0]);
    root.addChild(cart);
    tracks.push({
      node: cart,
      path: 'translation',
      sample: (timeSeconds) => [3 * Math.sin(2 * Math.PI * ease * timeSeconds - Math.PI / 2), 0.3, 0]
    });
    mount = cart;
  } else {
    const pivot = document.createNode('Orbit Pivot').setTranslation([0, 2, 0]);
    const arm = document.createNode('Orbit Arm').setTranslation([0, 0, 6]);
    root.addChild(pivot);
    pivot.addChild(arm);
    tracks.push(rotationTrack(pivot, [{ axis: 'y', turnsPerSecond: 1 / durationSeconds }]));
    mount = arm;
  }
  const pan = document.createNode('Pan').setTranslation([0, 0.4, 0]);
  const tiltNode = document.createNode('Tilt');
  const cameraNode = document.createNode('Camera').setTranslation([0, 0, 0.1]);
  cameraNode.setCamera(
    document
      .createCamera(options.name)
      .setType('perspective')
      .setYFov(0.6)
      .setAspectRatio(16 / 9)
      .setZNear(0.1)
      .setZFar(500)
  );
  mount.addChild(pan);
  pan.addChild(tiltNode);
  tiltNode.addChild(cameraNode);
  const panCurves: AngleCurve[] = [{ axis: 'y', amplitudeDegrees: sweep / 2, frequencyHz: ease, phaseTurns: 0.75 }];
  const tiltCurves: AngleCurve[] = [
    { axis: 'x', offsetDegrees: tilt, amplitudeDegrees: 6, frequencyHz: ease * 2 },
    { axis: 'z', amplitudeDegrees: 1.5, frequencyHz: 0.5 }
  ];
  tracks.push(rotationTrack(pan, panCurves), rotationTrack(tiltNode, tiltCurves));
  addSampledClip(document, {
    name: options.shot,
    durationSeconds,
    interpolation: 'LINEAR',
    keysPerSecond: CINEMATIC_FRAMES_PER_SECOND,
    tracks
  });
  return document;
}

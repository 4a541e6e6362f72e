/**
 * The dock windlass prop: a drum that hauls rope (one full turn per 3 s, baked at 30 fps), pays
 * it out in a second clip, and a ratchet pawl that clicks over the teeth with STEP keys.
 */
import type { Document } from '@gltf-transform/core';
import { addKeyedTrack, addSampledClip, rotationTrack } from './animation-clip';
import { createDemoDocument } from './demo-document';
import { fromAxisAngle } from './quaternion';
import { addShapeMesh, box, mergeShapes, prismBetween } from './mesh-shape';

/** Options for {@link createDockWindlass}. */
export interface DockWindlassOptions {
  /** Seconds per drum turn while hauling (3 by default). */
  haulTurnSeconds?: number;
}

/** Builds the windlass document; pure, so equal options give equal bytes. */
export function createDockWindlass(options: DockWindlassOptions = {}): Document {
  const haulTurnSeconds = options.haulTurnSeconds ?? 3;
  const document = createDemoDocument('Dock Windlass');
  const scene = document.getRoot().listScenes()[0];
  const base = document
    .createNode('Windlass')
    .setMesh(
      addShapeMesh(
        document,
        'Frame',
        mergeShapes([
          box([1.2, 0.1, 0.6]),
          box([0.1, 0.7, 0.5], [0.55, 0.35, 0]),
          box([0.1, 0.7, 0.5], [-0.55, 0.35, 0])
        ])
      )
    );
  const drum = document
    .createNode('Drum')
    .setTranslation([0, 0.6, 0])
    .setMesh(
      addShapeMesh(
        document,
        'Drum',
        mergeShapes([prismBetween([-0.5, 0, 0], [0.5, 0, 0], 0.18), box([0.05, 0.4, 0.05], [0.62, -0.2, 0])])
      )
    );
  const pawl = document
    .createNode('Pawl')
    .setTranslation([0.45, 0.85, -0.2])
    .setMesh(addShapeMesh(document, 'Pawl', box([0.04, 0.04, 0.2], [0, 0, 0.1])));
  scene.addChild(base);
  base.addChild(drum).addChild(pawl);

  const haul = addSampledClip(document, {
    name: 'Haul',
    durationSeconds: haulTurnSeconds,
    interpolation: 'LINEAR',
    keysPerSecond: 30,
    tracks: [rotationTrack(drum, [{ axis: 'x', turnsPerSecond: -1 / haulTurnSeconds }])]
  });
  // Each half second the pawl lifts over a tooth and drops back: STEP, because it snaps.
  const clickTimes = Array.from({ length: Math.floor(haulTurnSeconds * 2) + 1 }, (_, click) => click * 0.5);
  addKeyedTrack(document, haul, {
    node: pawl,
    path: 'rotation',
    interpolation: 'STEP',
    times: clickTimes,
    values: clickTimes.map((_, click) => fromAxisAngle([1, 0, 0], ((click % 2 ? 14 : 0) * Math.PI) / 180))
  });
  addSampledClip(document, {
    name: 'Pay Out',
    durationSeconds: 2,
    interpolation: 'LINEAR',
    keysPerSecond: 30,
    tracks: [rotationTrack(drum, [{ axis: 'x', turnsPerSecond: 0.5, amplitudeDegrees: 10, frequencyHz: 1 }])]
  });
  return document;
}

/**
 * The lighthouse lamp prop: a tower, a lamp housing, a rotor that sweeps the beam one full turn
 * per 8 s clip, and a switch lever keyed with STEP (it snaps, it never swings).
 */
import type { Document } from '@gltf-transform/core';
import { addKeyedTrack, addSampledClip, rotationTrack } from './animation-clip';
import { createDemoDocument } from './demo-document';
import { fromAxisAngle, type Quat } from './quaternion';
import { addShapeMesh, box, mergeShapes } from './mesh-shape';

/** Options for {@link createLighthouseLamp}. */
export interface LighthouseLampOptions {
  /**
   * How the rotor's turn is keyed. `quarter-turns`: 5 keys, 90° apart, the way an animator keys
   * a steady spin by hand (LINEAR slerp keeps 90° steps unambiguous). `every-frame`: a 30 fps bake.
   */
  rotorKeying?: 'quarter-turns' | 'every-frame';
  /** Clip length in seconds for one full turn. */
  turnSeconds?: number;
}

/** Builds the lamp document; pure, so equal options give equal bytes. */
export function createLighthouseLamp(options: LighthouseLampOptions = {}): Document {
  const turnSeconds = options.turnSeconds ?? 8;
  const document = createDemoDocument('Lighthouse Lamp');
  const scene = document.getRoot().listScenes()[0];
  const tower = document
    .createNode('Lighthouse')
    .setMesh(
      addShapeMesh(document, 'Tower', mergeShapes([box([1.4, 5.6, 1.4], [0, 2.8, 0]), box([2, 0.2, 2], [0, 5.7, 0])]))
    );
  const housing = document.createNode('Lamp Housing').setTranslation([0, 6, 0]);
  const rotor = document
    .createNode('Lamp Rotor')
    .setMesh(
      addShapeMesh(
        document,
        'Lenses',
        mergeShapes([box([0.3, 0.5, 0.1], [0, 0.3, 0.45]), box([0.3, 0.5, 0.1], [0, 0.3, -0.45])])
      )
    );
  const lever = document
    .createNode('Lamp Switch')
    .setTranslation([0.7, -0.2, 0])
    .setMesh(addShapeMesh(document, 'Lever', box([0.04, 0.3, 0.04], [0, 0.15, 0])));
  scene.addChild(tower);
  tower.addChild(housing);
  housing.addChild(rotor).addChild(lever);

  const beamCurves = [{ axis: 'y' as const, turnsPerSecond: 1 / turnSeconds }];
  const beam =
    options.rotorKeying === 'every-frame'
      ? addSampledClip(document, {
          name: 'Beacon',
          durationSeconds: turnSeconds,
          interpolation: 'LINEAR',
          keysPerSecond: 30,
          tracks: [rotationTrack(rotor, beamCurves)]
        })
      : document.createAnimation('Beacon');
  if (options.rotorKeying !== 'every-frame') {
    const quarterTimes = [0, 1, 2, 3, 4].map((quarter) => (quarter * turnSeconds) / 4);
    addKeyedTrack(document, beam, {
      node: rotor,
      path: 'rotation',
      interpolation: 'LINEAR',
      times: quarterTimes,
      values: quarterTimes.map((_, quarter) => fromAxisAngle([0, 1, 0], (quarter * Math.PI) / 2))
    });
  }
  const leverOff: Quat = fromAxisAngle([1, 0, 0], (-35 * Math.PI) / 180);
  const leverOn: Quat = fromAxisAngle([1, 0, 0], (35 * Math.PI) / 180);
  addKeyedTrack(document, beam, {
    node: lever,
    path: 'rotation',
    interpolation: 'STEP',
    times: [0, 0.5, turnSeconds - 0.5],
    values: [leverOff, leverOn, leverOff]
  });
  return document;
}

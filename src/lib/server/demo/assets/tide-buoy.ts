/**
 * The tide buoy prop: the whole buoy bobs and tilts on the swell (translation and rotation on the
 * scene root, baked at 30 fps) while its bell clapper swings inside the cage.
 */
import type { Document } from '@gltf-transform/core';
import { addSampledClip, rotationTrack } from './animation-clip';
import { createDemoDocument } from './demo-document';
import { addShapeMesh, box, mergeShapes, prismBetween } from './mesh-shape';

/** Options for {@link createTideBuoy}. */
export interface TideBuoyOptions {
  /** Height of the swell in metres, crest to trough (0.3 by default). */
  swellMetres?: number;
  /** Largest tilt on the swell in degrees (8 by default). */
  tiltDegrees?: number;
}

/** Builds the buoy document; pure, so equal options give equal bytes. */
export function createTideBuoy(options: TideBuoyOptions = {}): Document {
  const swellMetres = options.swellMetres ?? 0.3;
  const tiltDegrees = options.tiltDegrees ?? 8;
  const document = createDemoDocument('Tide Buoy');
  const scene = document.getRoot().listScenes()[0];
  const buoy = document
    .createNode('Tide Buoy')
    .setMesh(
      addShapeMesh(
        document,
        'Float',
        mergeShapes([box([1, 0.8, 1], [0, 0, 0]), prismBetween([0, 0.4, 0], [0, 1.6, 0], 0.35)])
      )
    );
  const bell = document.createNode('Bell').setTranslation([0, 1.5, 0]);
  const clapper = document
    .createNode('Bell Clapper')
    .setMesh(addShapeMesh(document, 'Clapper', prismBetween([0, 0, 0], [0, -0.3, 0], 0.03)));
  scene.addChild(buoy);
  buoy.addChild(bell);
  bell.addChild(clapper);

  addSampledClip(document, {
    name: 'Swell',
    durationSeconds: 4,
    interpolation: 'LINEAR',
    keysPerSecond: 30,
    tracks: [
      {
        node: buoy,
        path: 'translation',
        sample: (timeSeconds) => [0, (swellMetres / 2) * Math.sin((2 * Math.PI * timeSeconds) / 4), 0]
      },
      rotationTrack(buoy, [
        { axis: 'x', amplitudeDegrees: tiltDegrees, frequencyHz: 0.25, phaseTurns: 0.25 },
        { axis: 'z', amplitudeDegrees: tiltDegrees * 0.6, frequencyHz: 0.5, phaseTurns: 0.1 }
      ]),
      rotationTrack(clapper, [
        { axis: 'z', amplitudeDegrees: 25, frequencyHz: 0.5, phaseTurns: 0.35 },
        { axis: 'x', amplitudeDegrees: 10, frequencyHz: 0.25 }
      ])
    ]
  });
  return document;
}

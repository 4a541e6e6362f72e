import type { Document } from '@gltf-transform/core';
import { fromAxisAngle } from '../quaternion';

/** Name of the wrapper node {@link bakeZUpCorrection} adds. */
export const Z_UP_CORRECTION_NODE = 'ZUp Correction';

/** Options for {@link bakeZUpCorrection}. */
export interface BakeZUpCorrectionOptions {
  /** Name of the wrapper node ({@link Z_UP_CORRECTION_NODE} by default). */
  nodeName?: string;
}

/**
 * Wraps each scene's content in one new root node rotated -90° about X: the Z-up to Y-up
 * conversion a DCC exporter bakes into the hierarchy instead of into the data (glTF 2.0 §3.4
 * defines +Y up, so a file that needs this node was authored in the wrong basis). Animations
 * keep working; every consumer that reads root rotations as gameplay facing is now off by 90°.
 * Mutates and returns `document`.
 */
export function bakeZUpCorrection(document: Document, options: BakeZUpCorrectionOptions = {}): Document {
  for (const scene of document.getRoot().listScenes()) {
    const correction = document
      .createNode(options.nodeName ?? Z_UP_CORRECTION_NODE)
      .setRotation(fromAxisAngle([1, 0, 0], -Math.PI / 2));
    for (const child of scene.listChildren()) {
      scene.removeChild(child);
      correction.addChild(child);
    }
    scene.addChild(correction);
  }
  return document;
}

/**
 * A fresh document stamped the way the fictional studio's exporter stamps its files, so the
 * demo's assets read as Lanternfish Interactive's own rather than as test fixtures.
 */
import { Document } from '@gltf-transform/core';

/** The generator string written into every demo asset's `asset.generator`. */
export const DEMO_GENERATOR = 'Lanternfish Tidewatch exporter 2.3';

/** An empty document with one scene named `scene` and the studio's generator and copyright. */
export function createDemoDocument(scene: string): Document {
  const document = new Document();
  document.getRoot().getAsset().generator = DEMO_GENERATOR;
  document.getRoot().getAsset().copyright = 'Lanternfish Interactive (fictional studio, demo data)';
  const created = document.createScene(scene);
  document.getRoot().setDefaultScene(created);
  return document;
}

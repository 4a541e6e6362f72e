/**
 * Every asset the demo's builds contain: where it lives in the build, which project owns it,
 * and how to generate any revision of it. Revisions differ the way re-exports do (a little more
 * or less swing, a retimed clip), so each build's files hash differently and the history reads
 * as work in progress rather than one file copied forward.
 */
import type { Document } from '@gltf-transform/core';
import { createCameraRig } from './camera-rig';
import { createCharacter } from './character';
import { quantizeRotations } from './defects/quantize-rotations';
import { createDockWindlass } from './dock-windlass';
import type { DemoProjectSlug } from './demo-projects';
import { createLighthouseLamp } from './lighthouse-lamp';
import { createSeededRandom, seedFromText } from './seeded-random';
import { createTideBuoy } from './tide-buoy';

/** Keys of the demo's assets. */
export type DemoAssetKey =
  | 'kelp-diver'
  | 'harbor-warden'
  | 'lamp-keeper'
  | 'net-mender'
  | 'lighthouse-lamp'
  | 'dock-windlass'
  | 'tide-buoy'
  | 'tide-buoy-lod1'
  | 'dock-crane-cam'
  | 'lighthouse-orbit-cam'
  | 'kelp-dolly-cam';

/** One asset of the demo. */
export interface DemoAsset {
  /** Path in the build; `.gltf` assets come with a `.bin` side file of the same name. */
  path: string;
  project: DemoProjectSlug;
  title: string;
  /** Generates revision `revision` (1, 2, …); pure, so equal revisions give equal bytes. */
  create(revision: number): Document;
}

/** A factor near 1 that varies by asset and revision: the small differences between re-exports. */
function jitter(key: DemoAssetKey, revision: number, spread: number): number {
  return 1 + spread * (createSeededRandom(seedFromText(`${key}#${revision}`))() - 0.5);
}

/** The demo's assets by key. */
export const DEMO_ASSETS: Readonly<Record<DemoAssetKey, DemoAsset>> = {
  'kelp-diver': {
    path: 'chars/kelp-diver.glb',
    project: 'tidewatch-characters',
    title: 'Kelp Diver',
    // Revision 2 brings the new crawl swim cycle; revision 1 swims breaststroke.
    create: (revision) =>
      createCharacter({
        name: 'Kelp Diver',
        heightScale: 0.97,
        amplitudeScale: jitter('kelp-diver', revision, 0.12),
        swimStyle: revision >= 2 ? 'crawl' : 'breaststroke'
      })
  },
  'harbor-warden': {
    path: 'chars/harbor-warden.gltf',
    project: 'tidewatch-characters',
    title: 'Harbor Warden',
    create: (revision) =>
      createCharacter({
        name: 'Harbor Warden',
        heightScale: 1.06,
        amplitudeScale: 0.8 * jitter('harbor-warden', revision, 0.12)
      })
  },
  'lamp-keeper': {
    path: 'chars/lamp-keeper.glb',
    project: 'tidewatch-characters',
    title: 'Lamp Keeper',
    create: (revision) =>
      createCharacter({
        name: 'Lamp Keeper',
        heightScale: 0.92,
        amplitudeScale: 0.7 * jitter('lamp-keeper', revision, 0.1),
        heldProp: 'lantern'
      })
  },
  'net-mender': {
    path: 'chars/net-mender.glb',
    project: 'tidewatch-characters',
    title: 'Net Mender',
    create: (revision) =>
      createCharacter({
        name: 'Net Mender',
        heightScale: 1,
        amplitudeScale: jitter('net-mender', revision, 0.1),
        heldProp: 'boathook'
      })
  },
  'lighthouse-lamp': {
    path: 'props/lighthouse-lamp.glb',
    project: 'tidewatch-props',
    title: 'Lighthouse Lamp',
    // Revision 2 (the lamp rework) bakes the rotor every frame instead of keying quarter turns.
    create: (revision) =>
      createLighthouseLamp({
        rotorKeying: revision >= 2 ? 'every-frame' : 'quarter-turns',
        turnSeconds: revision >= 3 ? 6 + (revision - 3) * 0.5 : 8
      })
  },
  'dock-windlass': {
    path: 'props/dock-windlass.glb',
    project: 'tidewatch-props',
    title: 'Dock Windlass',
    create: (revision) => createDockWindlass({ haulTurnSeconds: revision >= 2 ? 3.5 : 3 })
  },
  'tide-buoy': {
    path: 'props/tide-buoy.gltf',
    project: 'tidewatch-props',
    title: 'Tide Buoy',
    create: (revision) =>
      createTideBuoy({ swellMetres: 0.3 * jitter('tide-buoy', revision, 0.4), tiltDegrees: revision >= 2 ? 10 : 8 })
  },
  'tide-buoy-lod1': {
    path: 'props/tide-buoy-lod1.glb',
    project: 'tidewatch-props',
    title: 'Tide Buoy (LOD 1, quantized)',
    create: (revision) =>
      quantizeRotations(createTideBuoy({ swellMetres: 0.3 * jitter('tide-buoy-lod1', revision, 0.4), tiltDegrees: 8 }))
  },
  'dock-crane-cam': {
    path: 'cams/dock-crane-cam.glb',
    project: 'tidewatch-cinematics',
    title: 'Dock Crane Cam',
    create: (revision) =>
      createCameraRig({
        name: 'Dock Crane Cam',
        kind: 'crane',
        shot: 'Shot 010',
        panSweepDegrees: 40 + 6 * revision,
        tiltDegrees: -12 * jitter('dock-crane-cam', revision, 0.3)
      })
  },
  'lighthouse-orbit-cam': {
    path: 'cams/lighthouse-orbit-cam.gltf',
    project: 'tidewatch-cinematics',
    title: 'Lighthouse Orbit Cam',
    create: (revision) =>
      createCameraRig({
        name: 'Lighthouse Orbit Cam',
        kind: 'orbit',
        shot: 'Shot 020',
        durationSeconds: revision >= 3 ? 8 : 10,
        tiltDegrees: -15 * jitter('lighthouse-orbit-cam', revision, 0.3)
      })
  },
  'kelp-dolly-cam': {
    path: 'cams/kelp-dolly-cam.glb',
    project: 'tidewatch-cinematics',
    title: 'Kelp Dolly Cam',
    create: (revision) =>
      createCameraRig({
        name: 'Kelp Dolly Cam',
        kind: 'dolly',
        shot: 'Shot 030',
        durationSeconds: revision >= 2 ? 7 : 5,
        panSweepDegrees: 30 * jitter('kelp-dolly-cam', revision, 0.3)
      })
  }
};

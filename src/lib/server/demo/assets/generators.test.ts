import { WebIO, type Document } from '@gltf-transform/core';
import { quat } from 'gl-matrix';
import { describe, expect, test } from 'vitest';
import { toGlb } from './asset-files';
import { createCameraRig } from './camera-rig';
import { createCharacter } from './character';
import { DEMO_ASSETS } from './demo-asset-catalog';
import { createDockWindlass } from './dock-windlass';
import { createLighthouseLamp } from './lighthouse-lamp';
import { consecutiveDots, listRotationTracks, roundTripGlb } from './testing';
import { createTideBuoy } from './tide-buoy';

/** Every generator, in each of its shapes, plus every catalog asset at two revisions. */
const GENERATED: [string, () => Document][] = [
  ['character, breaststroke', () => createCharacter({ name: 'Kelp Diver' })],
  [
    'character, crawl with lantern',
    () => createCharacter({ name: 'Lamp Keeper', swimStyle: 'crawl', heldProp: 'lantern' })
  ],
  [
    'character, boathook, scaled',
    () => createCharacter({ name: 'Net Mender', heightScale: 1.1, amplitudeScale: 1.3, heldProp: 'boathook' })
  ],
  ['lighthouse lamp, quarter turns', () => createLighthouseLamp()],
  ['lighthouse lamp, every frame', () => createLighthouseLamp({ rotorKeying: 'every-frame', turnSeconds: 6 })],
  ['dock windlass', () => createDockWindlass()],
  ['tide buoy', () => createTideBuoy({ swellMetres: 0.4, tiltDegrees: 10 })],
  ['crane camera', () => createCameraRig({ name: 'Dock Crane Cam', kind: 'crane', shot: 'Shot 010' })],
  [
    'dolly camera',
    () => createCameraRig({ name: 'Kelp Dolly Cam', kind: 'dolly', shot: 'Shot 030', durationSeconds: 7 })
  ],
  ['orbit camera', () => createCameraRig({ name: 'Lighthouse Orbit Cam', kind: 'orbit', shot: 'Shot 020' })],
  ...Object.entries(DEMO_ASSETS).flatMap(([key, asset]): [string, () => Document][] => [
    [`catalog ${key} r1`, () => asset.create(1)],
    [`catalog ${key} r4`, () => asset.create(4)]
  ])
];

describe.each(GENERATED)('generated %s', (_, generate) => {
  test('survives a GLB round trip through @gltf-transform/core with its structure intact', async () => {
    const document = generate();
    const readBack = await roundTripGlb(document);
    const counts = (d: Document) => [
      d.getRoot().listNodes().length,
      d.getRoot().listMeshes().length,
      d.getRoot().listAnimations().length,
      d.getRoot().listSkins().length,
      d.getRoot().listCameras().length,
      d.getRoot().listAccessors().length
    ];
    expect(counts(readBack)).toEqual(counts(document));
    expect(readBack.getRoot().listAnimations().length).toBeGreaterThan(0);
  });

  test('writes every sampler with an explicit interpolation', async () => {
    const { json } = await new WebIO().writeJSON(generate());
    const samplers = (json.animations ?? []).flatMap((animation) => animation.samplers);
    expect(samplers.length).toBeGreaterThan(0);
    // glTF 2.0 §5.10: interpolation defaults to LINEAR when absent; our style writes it always.
    for (const sampler of samplers) expect(['LINEAR', 'STEP', 'CUBICSPLINE']).toContain(sampler.interpolation);
  });

  test('stores unit rotation keys with no negative dot between consecutive keys', async () => {
    const tracks = listRotationTracks(await roundTripGlb(generate()));
    expect(tracks.length).toBeGreaterThan(0);
    for (const track of tracks) {
      // Oracle: gl-matrix quat.length; glTF 2.0 §3.5.2 rotations are unit quaternions.
      // Quantized outputs carry the §3.11 step of 1/32767 per component, so they get a matching tolerance.
      const unitTolerance = track.normalized ? 1e-4 : 1e-6;
      for (const key of track.keys) expect(Math.abs(quat.length(key) - 1)).toBeLessThan(unitTolerance);
      // Oracle: gl-matrix quat.dot; a negative dot would be a hemisphere jump (glTF 2.0 Appendix C).
      for (const dot of consecutiveDots(track.keys)) expect(dot).toBeGreaterThanOrEqual(0);
    }
  });

  test('stays small: well under 200 KB as GLB', async () => {
    expect((await toGlb(generate())).byteLength).toBeLessThan(200_000);
  });

  test('is pure: two generations give identical GLB bytes', async () => {
    expect(await toGlb(generate())).toEqual(await toGlb(generate()));
  });
});

describe('generation speed', () => {
  test('every catalog asset generates and writes in well under a second', async () => {
    const started = performance.now();
    for (const asset of Object.values(DEMO_ASSETS)) await toGlb(asset.create(1));
    // Common practice: the demo plan must generate in a few seconds; one pass over the catalog is a fraction.
    expect(performance.now() - started).toBeLessThan(1000);
  });
});

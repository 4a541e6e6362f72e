/**
 * End-to-end truth from real files: the six reference assets in tests/fixtures/reference/, read by
 * the library and compared with the facts their MANIFEST.md states (computed there independently,
 * with a plain script and no packages). Every expected number below is quoted from that MANIFEST.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it, vi } from 'vitest';
import { defaultPolicy } from './policy';
import { lintAsset } from './lint-asset';
import { readAssetDocument } from './read/read-asset-document';
import { readAssetFacts } from './read/read-asset-facts';
import { readRotationChannels } from './read/read-rotation-channels';
import type { RotationChannel } from './read/rotation-channel';

const folder = fileURLToPath(new URL('../../../tests/fixtures/reference/', import.meta.url));

function sourceOf(fileName: string) {
  const readSideFile = vi.fn(async () => null);
  return { path: `reference/${fileName}`, bytes: new Uint8Array(readFileSync(folder + fileName)), readSideFile };
}

interface ManifestSummary {
  file: string;
  animations: number;
  rotationChannels: number;
  interpolations: Record<string, number>;
  rotationKeys: number;
  /** null where the MANIFEST says "n/a" (no rotation keys). */
  normMin: number | null;
  normMax: number | null;
  negativeDotPairs: number;
  staticNodeRotations: number;
}

// Each row is the "Summary" line of that file in tests/fixtures/reference/MANIFEST.md.
const MANIFEST: ManifestSummary[] = [
  {
    file: 'AnimatedTriangle.gltf',
    animations: 1,
    rotationChannels: 1,
    interpolations: { LINEAR: 1 },
    rotationKeys: 5,
    normMin: 0.999849013,
    normMax: 1,
    negativeDotPairs: 1,
    staticNodeRotations: 1
  },
  {
    file: 'SimpleSkin.gltf',
    animations: 1,
    rotationChannels: 1,
    interpolations: { LINEAR: 1 },
    rotationKeys: 12,
    normMin: 0.999849013,
    normMax: 1.00023249,
    negativeDotPairs: 0,
    staticNodeRotations: 1
  },
  {
    file: 'SimpleSkin__3f6a8bc3.gltf',
    animations: 1,
    rotationChannels: 1,
    interpolations: { LINEAR: 1 },
    rotationKeys: 12,
    normMin: 0.999849013,
    normMax: 1.00023249,
    negativeDotPairs: 0,
    staticNodeRotations: 1
  },
  {
    file: 'RiggedFigure.gltf',
    animations: 1,
    rotationChannels: 19,
    interpolations: { LINEAR: 19 },
    rotationKeys: 38,
    normMin: 0.999999507,
    normMax: 1.00000034,
    negativeDotPairs: 0,
    staticNodeRotations: 19
  },
  {
    file: 'SimpleMorph.gltf',
    animations: 1,
    rotationChannels: 0,
    interpolations: {},
    rotationKeys: 0,
    normMin: null,
    normMax: null,
    negativeDotPairs: 0,
    staticNodeRotations: 0
  },
  {
    file: 'OrientationTest.gltf',
    animations: 0,
    rotationChannels: 0,
    interpolations: {},
    rotationKeys: 0,
    normMin: null,
    normMax: null,
    negativeDotPairs: 0,
    staticNodeRotations: 3
  }
];

/** Norm extremes over every rotation key value (tangents excluded), as the MANIFEST computes them. */
function normRange(channels: RotationChannel[]): { min: number; max: number } | null {
  let min = Infinity;
  let max = -Infinity;
  for (const channel of channels) {
    for (let keyIndex = 0; keyIndex < channel.keyCount; keyIndex++) {
      const v = channel.values;
      const o = keyIndex * 4;
      const norm = Math.hypot(v[o], v[o + 1], v[o + 2], v[o + 3]);
      min = Math.min(min, norm);
      max = Math.max(max, norm);
    }
  }
  return min === Infinity ? null : { min, max };
}

/** Consecutive key pairs of LINEAR/CUBICSPLINE channels whose 4D dot product is negative. */
function countNegativeDotPairs(channels: RotationChannel[]): number {
  let count = 0;
  for (const channel of channels) {
    if (channel.interpolation === 'STEP') continue;
    const v = channel.values;
    for (let keyIndex = 1; keyIndex < channel.keyCount; keyIndex++) {
      const a = (keyIndex - 1) * 4;
      const b = keyIndex * 4;
      if (v[a] * v[b] + v[a + 1] * v[b + 1] + v[a + 2] * v[b + 2] + v[a + 3] * v[b + 3] < 0) count++;
    }
  }
  return count;
}

describe('reference assets (facts from tests/fixtures/reference/MANIFEST.md)', () => {
  for (const expected of MANIFEST) {
    describe(expected.file, () => {
      it('reads without errors and without asking for side files (buffers are data URIs)', async () => {
        const source = sourceOf(expected.file);
        const document = await readAssetDocument(source);
        expect(document.getRoot().listAnimations()).toHaveLength(expected.animations);
        expect(source.readSideFile).not.toHaveBeenCalled();
      });

      it('has the rotation channels, interpolation modes and key count the MANIFEST states', async () => {
        const channels = readRotationChannels(await readAssetDocument(sourceOf(expected.file)));
        expect(channels).toHaveLength(expected.rotationChannels);
        const interpolations: Record<string, number> = {};
        for (const channel of channels) {
          interpolations[channel.interpolation] = (interpolations[channel.interpolation] ?? 0) + 1;
        }
        expect(interpolations).toEqual(expected.interpolations);
        expect(channels.reduce((sum, channel) => sum + channel.keyCount, 0)).toBe(expected.rotationKeys);
      });

      it('has the quaternion norm range and negative-dot pair count the MANIFEST states', async () => {
        const channels = readRotationChannels(await readAssetDocument(sourceOf(expected.file)));
        const range = normRange(channels);
        if (expected.normMin === null || expected.normMax === null) {
          expect(range).toBeNull();
        } else {
          // The MANIFEST prints nine significant digits: agreement within 1e-9 is exact up to its rounding.
          expect(range!.min).toBeCloseTo(expected.normMin, 8);
          expect(Math.abs(range!.min - expected.normMin)).toBeLessThan(1e-9);
          expect(Math.abs(range!.max - expected.normMax)).toBeLessThan(1e-9);
        }
        expect(countNegativeDotPairs(channels)).toBe(expected.negativeDotPairs);
      });

      it('counts the static node rotations the MANIFEST states (matrix nodes excluded)', async () => {
        const facts = readAssetFacts(await readAssetDocument(sourceOf(expected.file)));
        expect(facts.nodes.filter((node) => node.rotation !== null)).toHaveLength(expected.staticNodeRotations);
      });

      it('lints without an asset-unreadable finding and reports the same counts', async () => {
        const report = await lintAsset(sourceOf(expected.file), defaultPolicy());
        expect(report.unreadable).toBe(false);
        expect(report.findings.filter((finding) => finding.rule === 'asset-unreadable')).toEqual([]);
        expect(report.stats).toEqual({
          animations: expected.animations,
          rotationChannels: expected.rotationChannels,
          rotationKeys: expected.rotationKeys,
          nodesWithRotation: expected.staticNodeRotations
        });
      });
    });
  }

  it('AnimatedTriangle: the negative-dot pair is keys 3→4 with dot −0.707 (MANIFEST: a full 360° turn about Z)', async () => {
    const [channel] = readRotationChannels(await readAssetDocument(sourceOf('AnimatedTriangle.gltf')));
    const v = channel.values;
    const dot = v[12] * v[16] + v[13] * v[17] + v[14] * v[18] + v[15] * v[19];
    // MANIFEST gives the dot to three digits.
    expect(dot).toBeCloseTo(-0.707, 3);
  });

  it('OrientationTest: static rotations have norms 1.00000002..1.00000009 (MANIFEST)', async () => {
    const facts = readAssetFacts(await readAssetDocument(sourceOf('OrientationTest.gltf')));
    const norms = facts.nodes.filter((node) => node.rotation).map((node) => Math.hypot(...node.rotation!));
    expect(norms).toHaveLength(3);
    // Nine-digit bounds from the MANIFEST, widened by its rounding (5e-9).
    for (const norm of norms) {
      expect(norm).toBeGreaterThan(1.00000002 - 5e-9);
      expect(norm).toBeLessThan(1.00000009 + 5e-9);
    }
  });

  it('RiggedFigure: 19 joints, all in one skin, one root joint (MANIFEST: skinned, 19 joints)', async () => {
    const facts = readAssetFacts(await readAssetDocument(sourceOf('RiggedFigure.gltf')));
    expect(facts.skins).toHaveLength(1);
    expect(facts.skins[0].jointPaths).toHaveLength(19);
    expect(facts.nodes.filter((node) => node.isJoint)).toHaveLength(19);
    expect(facts.nodes.filter((node) => node.isRootJoint)).toHaveLength(1);
  });
});

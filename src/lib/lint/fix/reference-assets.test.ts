/**
 * Fixes on real files: the reference assets in tests/fixtures/reference/ (facts quoted from its
 * MANIFEST.md, computed there independently of the product), written back and re-linted.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { WebIO, type Document } from '@gltf-transform/core';
import { describe, expect, it } from 'vitest';
import { lintAsset } from '../lint-asset';
import { defaultPolicy } from '../policy';
import { readAssetDocument } from '../read/read-asset-document';
import { fixDocument } from './index';
import { largestWorldDifference, worldMatricesAt } from './sample-documents.fixture';

const folder = fileURLToPath(new URL('../../../../tests/fixtures/reference/', import.meta.url));
const policy = defaultPolicy();
const FIXED_RULES = ['unit-drift', 'hemisphere-jump', 'antipodal-keys', 'baked-basis', 'clip-basis-offset'];
const io = new WebIO();

function sourceOf(fileName: string, bytes?: Uint8Array) {
  return {
    path: `reference/${fileName}`,
    bytes: bytes ?? new Uint8Array(readFileSync(folder + fileName)),
    readSideFile: async () => null
  };
}

async function readForFixing(fileName: string): Promise<Document> {
  return readAssetDocument(sourceOf(fileName), { includeImages: true });
}

/** GLB bytes. The sample files keep one buffer per data URI and a GLB holds one (glTF 2.0 §4.4), so they merge. */
async function toGlb(document: Document): Promise<Uint8Array> {
  const [first, ...others] = document.getRoot().listBuffers();
  for (const accessor of document.getRoot().listAccessors()) accessor.setBuffer(first);
  for (const buffer of others) buffer.dispose();
  return io.writeBinary(document);
}

/** The document as .gltf JSON text plus its resources, written without changing the document. */
async function toGltfFiles(document: Document) {
  const { json, resources } = await io.writeJSON(document);
  return { json: JSON.stringify(json), resources };
}

/** Findings of the fixable rules after writing the document and linting the written bytes. */
async function fixableFindingsAfterWriting(fileName: string, document: Document) {
  const report = await lintAsset(sourceOf(fileName, await toGlb(document)), policy);
  return report.findings.filter((finding) => FIXED_RULES.includes(finding.rule));
}

describe('fixes on the reference assets', () => {
  it('AnimatedTriangle: negates the one key after its negative-dot pair (keys 3→4, MANIFEST) and nothing else', async () => {
    const document = await readForFixing('AnimatedTriangle.gltf');
    const original = [...document.getRoot().listAnimations()[0].listSamplers()[0].getOutput()!.getArray()!];

    const { applied, results } = await fixDocument(document, policy);

    expect(applied).toEqual(['unflipHemispheres']);
    expect(results.find((result) => result.fix === 'unflipHemispheres')!.keysChanged).toBe(1);
    const fixed = [...document.getRoot().listAnimations()[0].listSamplers()[0].getOutput()!.getArray()!];
    expect(fixed.slice(0, 16)).toEqual(original.slice(0, 16));
    expect(fixed.slice(16)).toEqual(original.slice(16).map((component) => -component + 0));
    expect(await fixableFindingsAfterWriting('AnimatedTriangle.gltf', document)).toEqual([]);
  });

  it('RiggedFigure: folds the Z_UP root correction into the content; joint matrices stay within 1e-5 at rest and at both keys', async () => {
    const document = await readForFixing('RiggedFigure.gltf');
    const before = [worldMatricesAt(document), worldMatricesAt(document, 0), worldMatricesAt(document, 1)];

    const { applied } = await fixDocument(document, policy);

    expect(applied).toEqual(['removeBakedBasis']);
    const after = [worldMatricesAt(document), worldMatricesAt(document, 0), worldMatricesAt(document, 1)];
    before.forEach((matrices, index) => {
      const largest = largestWorldDifference(matrices, after[index], ['Z_UP']);
      expect(largest.difference, largest.name).toBeLessThan(1e-5);
    });
    expect(await fixableFindingsAfterWriting('RiggedFigure.gltf', document)).toEqual([]);
  });

  it.each(['OrientationTest.gltf', 'SimpleMorph.gltf', 'SimpleSkin.gltf', 'SimpleSkin__3f6a8bc3.gltf'])(
    '%s: has nothing to fix, so the written files are identical to ones written without fixing',
    async (fileName) => {
      const untouched = await toGltfFiles(await readForFixing(fileName));
      const document = await readForFixing(fileName);
      const { applied } = await fixDocument(document, policy);
      expect(applied).toEqual([]);
      expect(await toGltfFiles(document)).toEqual(untouched);
    }
  );
});

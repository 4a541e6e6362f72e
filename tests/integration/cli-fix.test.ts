import { createHash } from 'node:crypto';
import { copyFile, mkdtemp, readdir, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { NodeIO, type Document } from '@gltf-transform/core';
import { ALL_EXTENSIONS, KHRMaterialsUnlit } from '@gltf-transform/extensions';
import { draco, meshopt } from '@gltf-transform/functions';
import draco3d from 'draco3dgltf';
import { MeshoptEncoder } from 'meshoptimizer';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  CLEAN_CHANNEL,
  createRotationDocument,
  DRIFTING_CHANNEL,
  FLIPPED_CUBIC_CHANNEL,
  writeGlb,
  writeGltf
} from '../../cli/testing/rotation-assets';
import { buildCli, runCli } from '../../cli/testing/run-cli';

const REFERENCE_FOLDER = resolve('tests/fixtures/reference');
const FIXED_RULES = ['hemisphere-jump', 'unit-drift'];
/** The 8-byte PNG signature: enough image bytes for a texture whose MIME type is set explicitly. */
const PNG_SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];

interface JsonReport {
  assets: { path: string; unreadable: boolean; findings: { rule: string; severity: string }[] }[];
}

let work: string;

async function sha256(path: string): Promise<string> {
  return createHash('sha256')
    .update(await readFile(path))
    .digest('hex');
}

/** The rules `orientry check` reports for `path`, via the JSON report. */
function rulesFound(path: string): string[] {
  const run = runCli(['check', path, '--format', 'json'], work);
  const report = JSON.parse(run.stdout) as JsonReport;
  expect(report.assets[0].unreadable).toBe(false);
  return report.assets[0].findings.map((finding) => finding.rule);
}

beforeAll(async () => {
  buildCli();
  work = await mkdtemp(join(tmpdir(), 'orientry-cli-fix-'));
  const broken = () => createRotationDocument([FLIPPED_CUBIC_CHANNEL, DRIFTING_CHANNEL]);
  const glb = await writeGlb(broken(), join(work, 'keeper.glb'));
  // The GLB header still declares the full length (glTF 2.0 §4.4.2), so the cut is detectable.
  await writeFile(join(work, 'truncated.glb'), glb.subarray(0, glb.byteLength - 40));
  await writeGltf(broken(), join(work, 'split/keeper.gltf'), 'keeper-data.bin');
  await writeGltf(broken(), join(work, 'collide/rig.gltf'), 'lantern.bin');

  // One texture beside the .gltf, one embedded as a data: URI.
  const textured = broken();
  const external = textured.createTexture('Sail').setImage(new Uint8Array(PNG_SIGNATURE)).setMimeType('image/png');
  const embedded = textured.createTexture('Glow').setImage(new Uint8Array(PNG_SIGNATURE)).setMimeType('image/png');
  const unlit = textured.createExtension(KHRMaterialsUnlit).createUnlit();
  textured
    .createMaterial('Canvas')
    .setBaseColorTexture(external.setURI('textures/sail.png'))
    .setEmissiveTexture(embedded)
    .setExtension('KHR_materials_unlit', unlit);
  await writeGltf(textured, join(work, 'textured/rig.gltf'), 'rig.bin');
  const texturedJson = JSON.parse(await readFile(join(work, 'textured/rig.gltf'), 'utf8')) as {
    images: { uri: string }[];
  };
  texturedJson.images[1].uri = `data:image/png;base64,${Buffer.from(PNG_SIGNATURE).toString('base64')}`;
  await writeFile(join(work, 'textured/rig.gltf'), JSON.stringify(texturedJson));

  // A Draco-compressed and a meshopt-compressed triangle pair beside the broken clip: the fix must
  // decode, not drop, the geometry.
  const dracoDocument = withSailMesh(broken());
  await dracoDocument.transform(draco());
  await new NodeIO()
    .registerExtensions(ALL_EXTENSIONS)
    .registerDependencies({ 'draco3d.encoder': await draco3d.createEncoderModule() })
    .write(join(work, 'sail.glb'), dracoDocument);
  await MeshoptEncoder.ready;
  const meshoptDocument = withSailMesh(broken());
  await meshoptDocument.transform(meshopt({ encoder: MeshoptEncoder }));
  await new NodeIO()
    .registerExtensions(ALL_EXTENSIONS)
    .registerDependencies({ 'meshopt.encoder': MeshoptEncoder })
    .write(join(work, 'sail-meshopt.glb'), meshoptDocument);
});

/** Adds a two-triangle mesh (4 vertices, 6 indices) to the scene root. */
function withSailMesh(document: Document): Document {
  const buffer = document.getRoot().listBuffers()[0];
  const positions = document
    .createAccessor()
    .setType('VEC3')
    .setArray(new Float32Array([0, 0, 0, 1, 0, 0, 0, 1, 0, 1, 1, 0]))
    .setBuffer(buffer);
  const indices = document
    .createAccessor()
    .setType('SCALAR')
    .setArray(new Uint16Array([0, 1, 2, 2, 1, 3]))
    .setBuffer(buffer);
  const primitive = document.createPrimitive().setAttribute('POSITION', positions).setIndices(indices);
  document.getRoot().listNodes()[0].setMesh(document.createMesh('Sail').addPrimitive(primitive));
  return document;
}

/** The extensions a written GLB declares, and its first primitive's vertex and index counts. */
async function readGlbFacts(path: string) {
  const bytes = await readFile(path);
  const jsonByteLength = bytes.readUInt32LE(12);
  const json = JSON.parse(bytes.subarray(20, 20 + jsonByteLength).toString('utf8')) as { extensionsUsed?: string[] };
  const document = await new NodeIO().registerExtensions(ALL_EXTENSIONS).read(path);
  const primitive = document.getRoot().listMeshes()[0].listPrimitives()[0];
  return {
    extensionsUsed: json.extensionsUsed ?? [],
    vertexCount: primitive.getAttribute('POSITION')?.getCount(),
    indexCount: primitive.getIndices()?.getCount()
  };
}

afterAll(async () => {
  await rm(work, { recursive: true, force: true });
});

describe('orientry fix', () => {
  it('writes a GLB copy in which the fixed rules are gone, leaving the input unchanged', async () => {
    expect(rulesFound('keeper.glb')).toEqual(expect.arrayContaining(FIXED_RULES));
    const before = await sha256(join(work, 'keeper.glb'));

    const run = runCli(['fix', 'keeper.glb', '-o', 'keeper.fixed.glb'], work);
    expect(run.status).toBe(0);
    expect(run.stdout).toBe('');
    expect(run.stderr).toContain('applied:');
    expect(run.stderr).toMatch(/findings before: [1-9]\d* error/);
    expect(run.stderr).toContain('findings after:');

    expect(await sha256(join(work, 'keeper.glb'))).toBe(before);
    const after = rulesFound('keeper.fixed.glb');
    for (const rule of FIXED_RULES) expect(after).not.toContain(rule);
    expect(runCli(['check', 'keeper.fixed.glb'], work).status).toBe(0);
  });

  it('writes a .gltf copy with its .bin named after it, leaving the input and its buffer unchanged', async () => {
    const inputHashes = [
      await sha256(join(work, 'split/keeper.gltf')),
      await sha256(join(work, 'split/keeper-data.bin'))
    ];

    const run = runCli(['fix', 'split/keeper.gltf', '-o', 'out/keeper-fixed.gltf'], work);
    expect(run.status).toBe(0);
    expect((await readdir(join(work, 'out'))).sort()).toEqual(['keeper-fixed.bin', 'keeper-fixed.gltf']);
    const json = JSON.parse(await readFile(join(work, 'out/keeper-fixed.gltf'), 'utf8')) as {
      buffers: { uri: string }[];
    };
    expect(json.buffers.map((buffer) => buffer.uri)).toEqual(['keeper-fixed.bin']);

    expect([await sha256(join(work, 'split/keeper.gltf')), await sha256(join(work, 'split/keeper-data.bin'))]).toEqual(
      inputHashes
    );
    const after = rulesFound('out/keeper-fixed.gltf');
    for (const rule of FIXED_RULES) expect(after).not.toContain(rule);
  });

  it('fixes only the rules named with --rules', () => {
    const run = runCli(['fix', 'keeper.glb', '-o', 'keeper.drift-only.glb', '--rules', 'unit-drift'], work);
    expect(run.status).toBe(0);
    const after = rulesFound('keeper.drift-only.glb');
    expect(after).not.toContain('unit-drift');
    expect(after).toContain('hemisphere-jump');
  });

  it('carries external and embedded images into a .gltf copy, and embeds them in a .glb copy', async () => {
    const run = runCli(['fix', 'textured/rig.gltf', '-o', 'textured-out/rig.gltf'], work);
    expect(run.status).toBe(0);
    const json = JSON.parse(await readFile(join(work, 'textured-out/rig.gltf'), 'utf8')) as {
      images: { uri: string }[];
      extensionsUsed: string[];
    };
    expect(json.extensionsUsed).toEqual(['KHR_materials_unlit']);
    // The external image keeps its relative URI; the embedded one is written beside the copy, named after it.
    expect(json.images.map((image) => image.uri)).toEqual(['textures/sail.png', 'rig_image1.png']);
    expect(await readFile(join(work, 'textured-out/textures/sail.png'))).toEqual(Buffer.from(PNG_SIGNATURE));
    expect(await readFile(join(work, 'textured-out/rig_image1.png'))).toEqual(Buffer.from(PNG_SIGNATURE));

    expect(runCli(['fix', 'textured/rig.gltf', '-o', 'textured-out/rig.glb'], work).status).toBe(0);
    const glb = await new NodeIO().read(join(work, 'textured-out/rig.glb'));
    const images = glb
      .getRoot()
      .listTextures()
      .map((texture) => texture.getImage());
    expect(images).toEqual([PNG_SIGNATURE, PNG_SIGNATURE].map((bytes) => new Uint8Array(bytes)));
  });

  it('refuses -o naming the input (however spelled) without --in-place, writing nothing', async () => {
    const before = await sha256(join(work, 'keeper.glb'));
    for (const output of ['keeper.glb', './keeper.glb', join(work, 'keeper.glb')]) {
      const run = runCli(['fix', 'keeper.glb', '-o', output], work);
      expect(run.status).toBe(2);
      expect(run.stderr).toContain('--in-place');
    }
    expect(await sha256(join(work, 'keeper.glb'))).toBe(before);
  });

  it('refuses a .gltf output whose .bin would overwrite a side file of the input', async () => {
    const before = await sha256(join(work, 'collide/lantern.bin'));
    const run = runCli(['fix', 'collide/rig.gltf', '-o', 'collide/lantern.gltf'], work);
    expect(run.status).toBe(2);
    expect(run.stderr).toContain('would overwrite a file the input was read from');
    expect(await sha256(join(work, 'collide/lantern.bin'))).toBe(before);
    expect(await readdir(join(work, 'collide'))).not.toContain('lantern.gltf');
  });

  it('overwrites the input with --in-place', async () => {
    await copyFile(join(work, 'keeper.glb'), join(work, 'in-place.glb'));
    const before = await sha256(join(work, 'in-place.glb'));
    const run = runCli(['fix', 'in-place.glb', '--in-place'], work);
    expect(run.status).toBe(0);
    expect(await sha256(join(work, 'in-place.glb'))).not.toBe(before);
    const after = rulesFound('in-place.glb');
    for (const rule of FIXED_RULES) expect(after).not.toContain(rule);
  });

  it('exits 2 for a rule that has no fix, an unsupported output type, a missing input and a damaged one', () => {
    const unfixable = runCli(['fix', 'keeper.glb', '-o', 'x.glb', '--rules', 'gimbal-proximity'], work);
    expect(unfixable.status).toBe(2);
    expect(unfixable.stderr).toContain('gimbal-proximity');
    const wrongType = runCli(['fix', 'keeper.glb', '-o', 'keeper.fbx'], work);
    expect(wrongType.status).toBe(2);
    expect(wrongType.stderr).toContain('.glb or .gltf');
    const missing = runCli(['fix', 'ghost.glb', '-o', 'x.glb'], work);
    expect(missing.status).toBe(2);
    expect(missing.stderr).toContain('ghost.glb');
    const truncated = runCli(['fix', 'truncated.glb', '-o', 'x.glb'], work);
    expect(truncated.status).toBe(2);
    expect(truncated.stderr).toContain('truncated.glb');
    expect(truncated.stderr).not.toContain('internal error');
  });

  it('decodes Draco geometry and writes it uncompressed, so no vertex is lost', async () => {
    const run = runCli(['fix', 'sail.glb', '-o', 'sail.fixed.glb'], work);
    expect(run.status).toBe(0);
    expect(run.stderr).toContain('KHR_draco_mesh_compression removed');
    // The four vertices and six indices written by withSailMesh.
    expect(await readGlbFacts(join(work, 'sail.fixed.glb'))).toEqual({
      extensionsUsed: [],
      vertexCount: 4,
      indexCount: 6
    });
    const after = rulesFound('sail.fixed.glb');
    for (const rule of FIXED_RULES) expect(after).not.toContain(rule);
  });

  it('decodes meshopt geometry and keeps the quantized attributes it decodes to', async () => {
    const run = runCli(['fix', 'sail-meshopt.glb', '-o', 'sail-meshopt.fixed.glb'], work);
    expect(run.status).toBe(0);
    expect(run.stderr).toContain('EXT_meshopt_compression removed');
    // meshopt() quantizes positions first, so the copy must still declare KHR_mesh_quantization.
    expect(await readGlbFacts(join(work, 'sail-meshopt.fixed.glb'))).toEqual({
      extensionsUsed: ['KHR_mesh_quantization'],
      vertexCount: 4,
      indexCount: 6
    });
    const after = rulesFound('sail-meshopt.fixed.glb');
    for (const rule of FIXED_RULES) expect(after).not.toContain(rule);
  });

  it('fixes each reference sample asset into a copy that reads back', async () => {
    for (const name of (await readdir(REFERENCE_FOLDER)).filter((file) => file.endsWith('.gltf'))) {
      const input = join(REFERENCE_FOLDER, name);
      const before = await sha256(input);
      for (const extension of ['glb', 'gltf']) {
        const output = join(work, 'reference', `${name}.${extension}`);
        const run = runCli(['fix', input, '-o', output], work);
        expect(run.stderr).not.toContain('internal error');
        expect(run.status).toBe(0);
        expect(runCli(['check', output, '--format', 'json'], work).stderr).not.toContain('internal error');
        expect(rulesFound(output)).not.toContain('asset-unreadable');
      }
      expect(await sha256(input)).toBe(before);
    }
  });

  it('leaves a clean asset clean', async () => {
    await writeGlb(createRotationDocument([CLEAN_CHANNEL]), join(work, 'clean.glb'));
    const run = runCli(['fix', 'clean.glb', '-o', 'clean.fixed.glb'], work);
    expect(run.status).toBe(0);
    expect(run.stderr).toContain('findings before: 0 errors');
    expect(runCli(['check', 'clean.fixed.glb'], work).status).toBe(0);
  });
});

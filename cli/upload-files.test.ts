import { mkdir, mkdtemp, readFile, rm, symlink, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CLEAN_CHANNEL, createRotationDocument, writeGlb, writeGltf } from './testing/rotation-assets';
import { CliError } from './cli-error';
import { ExitCode } from './exit-codes';
import type { InputFile } from './files';
import { collectUploadFiles } from './upload-files';

let root: string;

/** A .gltf whose buffers name `uris` (byte lengths are irrelevant to what is uploaded). */
async function gltfNaming(path: string, uris: string[]): Promise<void> {
  const json = { asset: { version: '2.0' }, buffers: uris.map((uri) => ({ byteLength: 4, uri })) };
  await writeFile(path, JSON.stringify(json));
}

function input(relativePath: string): InputFile {
  return { absolutePath: join(root, relativePath), displayPath: relativePath };
}

beforeAll(async () => {
  root = await mkdtemp(join(tmpdir(), 'orientry-upload-files-'));
  await writeGltf(createRotationDocument([CLEAN_CHANNEL]), join(root, 'chars/keeper.gltf'), 'keeper-data.bin');
  await writeGlb(createRotationDocument([CLEAN_CHANNEL]), join(root, 'props/buoy.glb'));
  // Two .gltf files sharing one buffer, and references the upload must not follow.
  await mkdir(join(root, 'rigs'));
  await writeFile(join(root, 'rigs/shared.bin'), 'shared');
  await gltfNaming(join(root, 'rigs/a.gltf'), ['shared.bin', '../props/buoy.glb', 'missing.bin']);
  await gltfNaming(join(root, 'rigs/b.gltf'), ['shared.bin', 'escape.bin']);
  await writeFile(join(root, 'secret.bin'), 'outside the rigs folder');
  await symlink(join(root, 'secret.bin'), join(root, 'rigs/escape.bin'));
});
afterAll(async () => {
  await rm(root, { recursive: true, force: true });
});

describe('collectUploadFiles', () => {
  it('adds the .bin a .gltf names, under paths relative to the root, with their sizes', async () => {
    const warnings: string[] = [];
    const files = await collectUploadFiles([input('props/buoy.glb'), input('chars/keeper.gltf')], root, (line) =>
      warnings.push(line)
    );
    expect(files.map(({ uploadPath, isAsset }) => ({ uploadPath, isAsset }))).toEqual([
      { uploadPath: 'chars/keeper-data.bin', isAsset: false },
      { uploadPath: 'chars/keeper.gltf', isAsset: true },
      { uploadPath: 'props/buoy.glb', isAsset: true }
    ]);
    for (const file of files) {
      expect(file.byteLength).toBe((await readFile(file.absolutePath)).length);
    }
    expect(warnings).toEqual([]);
  });

  it('uploads a shared side file once and warns about every reference it does not follow', async () => {
    const warnings: string[] = [];
    const files = await collectUploadFiles([input('rigs/a.gltf'), input('rigs/b.gltf')], root, (line) =>
      warnings.push(line)
    );
    expect(files.map((file) => file.uploadPath)).toEqual(['rigs/a.gltf', 'rigs/b.gltf', 'rigs/shared.bin']);
    expect(warnings).toEqual([
      'rigs/a.gltf: buffers[1].uri "../props/buoy.glb" climbs out of the asset folder; not uploaded (the server will report the asset)',
      'rigs/a.gltf: buffers[2].uri "missing.bin" names a file that does not exist; not uploaded (the server will report the asset)',
      `rigs/b.gltf: buffers[1].uri "escape.bin" resolves outside the asset's folder through a link; not uploaded`
    ]);
  });

  it('reads assets side by side yet warns in the order they were given', async () => {
    await mkdir(join(root, 'crowd'), { recursive: true });
    // The first asset takes longest to read (8 MB of JSON), so finishing order differs from the given order.
    const slow = {
      asset: { version: '2.0' },
      extras: { padding: 'x'.repeat(8 * 2 ** 20) },
      buffers: [{ byteLength: 4, uri: 'gone-00.bin' }]
    };
    await writeFile(join(root, 'crowd/slow.gltf'), JSON.stringify(slow));
    const names = ['crowd/slow.gltf'];
    for (let index = 1; index <= 24; index++) {
      const name = `crowd/extra-${String(index).padStart(2, '0')}.gltf`;
      await gltfNaming(join(root, name), [`gone-${String(index).padStart(2, '0')}.bin`]);
      names.push(name);
    }
    const warnings: string[] = [];
    const files = await collectUploadFiles(names.map(input), root, (line) => warnings.push(line));
    expect(warnings.map((line) => line.match(/gone-\d+/)?.[0])).toEqual(
      names.map((_, index) => `gone-${String(index).padStart(2, '0')}`)
    );
    expect(files.map((file) => file.uploadPath)).toEqual([...names].sort());
  });

  it('keeps a file both matched and named by another asset as an asset', async () => {
    const files = await collectUploadFiles([input('rigs/a.gltf'), input('rigs/shared.bin')], root, () => undefined);
    expect(files.find((file) => file.uploadPath === 'rigs/shared.bin')?.isAsset).toBe(true);
  });

  it('refuses an asset outside the root folder (exit 2), naming --root', async () => {
    const failure = await collectUploadFiles([input('chars/keeper.gltf')], join(root, 'props'), () => undefined).catch(
      (error: unknown) => error
    );
    expect(failure).toBeInstanceOf(CliError);
    expect((failure as CliError).code).toBe('input.outside-root');
    expect((failure as CliError).exitCode).toBe(ExitCode.UsageError);
    expect((failure as CliError).message).toContain('--root');
  });

  it('refuses a file name the server cannot take', async () => {
    await writeFile(join(root, 'props/bad\\name.glb'), 'x');
    const failure = await collectUploadFiles([input('props/bad\\name.glb')], root, () => undefined).catch(
      (error: unknown) => error
    );
    expect((failure as CliError).code).toBe('input.path-invalid');
  });
});

import { mkdir, mkdtemp, rm, symlink, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';
import { defaultPolicy, lintAsset } from '$lib/lint';
import { CliError } from './cli-error';
import { ExitCode } from './exit-codes';
import { createSideFileReader, expandInputs, readAssetSource } from './files';

// Records every path handed to readFile, so tests can prove a file was never opened.
const opened = vi.hoisted(() => ({ paths: [] as string[] }));
vi.mock('node:fs/promises', async (importOriginal) => {
  const actual = await importOriginal<typeof import('node:fs/promises')>();
  return {
    ...actual,
    readFile: ((path: Parameters<typeof actual.readFile>[0], ...rest: unknown[]) => {
      opened.paths.push(String(path));
      return (actual.readFile as (...args: unknown[]) => Promise<unknown>)(path, ...rest);
    }) as typeof actual.readFile
  };
});

let root: string;

/** A minimal valid .gltf naming one external buffer (glTF 2.0 §3.6.1: buffers with uri and byteLength). */
function gltfWithBuffer(uri: string, byteLength: number): string {
  return JSON.stringify({ asset: { version: '2.0' }, buffers: [{ uri, byteLength }] });
}

beforeAll(async () => {
  root = await mkdtemp(join(tmpdir(), 'orientry-files-'));
  // build/            chars/hero.glb, chars/Villain.GLB, props/lantern.gltf + lantern.bin, notes.txt
  // build/node_modules/pkg/sample.glb (ignored), outside/secret.bin (never to be read)
  await mkdir(join(root, 'build/chars'), { recursive: true });
  await mkdir(join(root, 'build/props/textures'), { recursive: true });
  await mkdir(join(root, 'build/node_modules/pkg'), { recursive: true });
  await mkdir(join(root, 'outside'), { recursive: true });
  await writeFile(join(root, 'build/chars/hero.glb'), 'glb');
  await writeFile(join(root, 'build/chars/Villain.GLB'), 'glb');
  await writeFile(join(root, 'build/props/lantern.gltf'), gltfWithBuffer('lantern.bin', 4));
  await writeFile(join(root, 'build/props/lantern.bin'), new Uint8Array([1, 2, 3, 4]));
  await writeFile(join(root, 'build/props/textures/rope.png'), new Uint8Array([5, 6]));
  await writeFile(join(root, 'build/props/notes.txt'), 'not an asset');
  await writeFile(join(root, 'build/node_modules/pkg/sample.glb'), 'glb');
  await writeFile(join(root, 'outside/secret.bin'), new Uint8Array([9, 9, 9, 9]));
  // A symlink inside the folder that points out of it, and one that stays inside.
  await symlink(join(root, 'outside/secret.bin'), join(root, 'build/props/escape.bin'));
  await symlink(join(root, 'build/props/lantern.bin'), join(root, 'build/props/alias.bin'));
  await symlink(join(root, 'outside'), join(root, 'build/props/linked-folder'));
});

afterAll(async () => {
  await rm(root, { recursive: true, force: true });
});

beforeEach(() => {
  opened.paths.length = 0;
});

describe('expandInputs', () => {
  it('expands a folder to every .glb and .gltf below it, any letter case, skipping node_modules', async () => {
    const { files } = await expandInputs(['build'], root);
    expect(files.map((file) => file.displayPath)).toEqual([
      'build/chars/Villain.GLB',
      'build/chars/hero.glb',
      'build/props/lantern.gltf'
    ]);
  });

  it('filters a glob to assets and resolves it against the working directory', async () => {
    const { files } = await expandInputs(['props/*'], join(root, 'build'));
    expect(files.map((file) => file.displayPath)).toEqual(['props/lantern.gltf']);
    expect(files[0].absolutePath).toBe(join(root, 'build/props/lantern.gltf'));
  });

  it('takes an explicitly named file whatever its extension, and lists each file once', async () => {
    const { files } = await expandInputs(['build/props/notes.txt', 'build/chars/hero.glb', 'build/chars'], root);
    expect(files.map((file) => file.displayPath)).toEqual([
      'build/chars/Villain.GLB',
      'build/chars/hero.glb',
      'build/props/notes.txt'
    ]);
  });

  it('reports globs that matched nothing while others matched', async () => {
    const result = await expandInputs(['build/chars', 'build/**/*.fbx'], root);
    expect(result.files).toHaveLength(2);
    expect(result.unmatchedPatterns).toEqual(['build/**/*.fbx']);
  });

  it('fails with a usage error when nothing matched', async () => {
    const error = await expandInputs(['build/**/*.fbx'], root).catch((caught: unknown) => caught);
    expect(error).toBeInstanceOf(CliError);
    expect((error as CliError).code).toBe('input.no-match');
    expect((error as CliError).exitCode).toBe(ExitCode.UsageError);
  });

  it('fails with a usage error for a plain path that does not exist', async () => {
    const error = await expandInputs(['build/chars/ghost.glb'], root).catch((caught: unknown) => caught);
    expect((error as CliError).code).toBe('input.not-found');
    expect((error as CliError).message).toContain('build/chars/ghost.glb');
  });

  it('names files outside the working directory by their absolute path', async () => {
    const { files } = await expandInputs([join(root, 'build/chars/hero.glb')], join(root, 'outside'));
    expect(files[0].displayPath).toBe(join(root, 'build/chars/hero.glb'));
  });
});

describe('createSideFileReader', () => {
  it('reads a side file in the folder and one in a subfolder', async () => {
    const read = createSideFileReader(join(root, 'build/props'));
    expect(await read('lantern.bin')).toEqual(new Uint8Array([1, 2, 3, 4]));
    expect(await read('textures/rope.png')).toEqual(new Uint8Array([5, 6]));
    // The recorder sees real reads, so the "never opened" checks below are not vacuous.
    expect(opened.paths).toEqual([join(root, 'build/props/lantern.bin'), join(root, 'build/props/textures/rope.png')]);
  });

  it('follows a symlink that stays inside the folder', async () => {
    const read = createSideFileReader(join(root, 'build/props'));
    expect(await read('alias.bin')).toEqual(new Uint8Array([1, 2, 3, 4]));
  });

  it('resolves null for a side file that does not exist', async () => {
    const read = createSideFileReader(join(root, 'build/props'));
    expect(await read('missing.bin')).toBeNull();
  });

  const escapes = [
    { name: 'a ".." path', path: '../../outside/secret.bin' },
    { name: 'an absolute path', path: '/outside/secret.bin' },
    { name: 'a symlinked file pointing outside', path: 'escape.bin' },
    { name: 'a path through a symlinked folder pointing outside', path: 'linked-folder/secret.bin' }
  ];
  for (const { name, path } of escapes) {
    it(`refuses ${name} without opening anything`, async () => {
      const read = createSideFileReader(join(root, 'build/props'));
      const target = path.startsWith('/') ? join(root, path) : path;
      const error = await read(target).catch((caught: unknown) => caught);
      expect((error as { code?: string }).code).toBe('asset.uri-outside-folder');
      expect(opened.paths).toEqual([]);
    });
  }

  it('tells the caller the real path of each side file it read', async () => {
    const seen: string[] = [];
    const read = createSideFileReader(join(root, 'build/props'), { onSideFileRead: (path) => seen.push(path) });
    await read('alias.bin');
    expect(seen).toEqual([join(root, 'build/props/lantern.bin')]);
  });
});

describe('readAssetSource with the lint library', () => {
  it('turns a .gltf whose buffer URI climbs out of its folder into an unreadable finding, never reading the target', async () => {
    await writeFile(join(root, 'build/props/climb.gltf'), gltfWithBuffer('../../outside/secret.bin', 4));
    const source = await readAssetSource({
      absolutePath: join(root, 'build/props/climb.gltf'),
      displayPath: 'build/props/climb.gltf'
    });
    const report = await lintAsset(source, defaultPolicy());
    expect(report.unreadable).toBe(true);
    expect(report.findings[0].values.code).toBe('asset.uri-outside-folder');
    expect(opened.paths.some((path) => path.includes('secret'))).toBe(false);
  });

  it('turns a .gltf whose buffer is a symlink out of the folder into an unreadable finding, never reading the target', async () => {
    await writeFile(join(root, 'build/props/linked.gltf'), gltfWithBuffer('escape.bin', 4));
    const source = await readAssetSource({
      absolutePath: join(root, 'build/props/linked.gltf'),
      displayPath: 'build/props/linked.gltf'
    });
    const report = await lintAsset(source, defaultPolicy());
    expect(report.unreadable).toBe(true);
    expect(report.findings[0].values.code).toBe('asset.uri-outside-folder');
    expect(opened.paths.some((path) => path.includes('secret') || path.endsWith('escape.bin'))).toBe(false);
  });

  it('reads a .gltf with its buffer beside it', async () => {
    const source = await readAssetSource({
      absolutePath: join(root, 'build/props/lantern.gltf'),
      displayPath: 'build/props/lantern.gltf'
    });
    const report = await lintAsset(source, defaultPolicy());
    expect(report.unreadable).toBe(false);
    // Main file plus the 4-byte buffer (sizes written above).
    expect(report.byteLength).toBe(source.bytes.byteLength + 4);
  });
});

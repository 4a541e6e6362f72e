import { describe, expect, it } from 'vitest';
import { findSidePath, isAssetPath } from './side-file-lookup';

describe('findSidePath', () => {
  const dropped = new Set(['props/lamp.gltf', 'props/lamp.bin', 'props/textures/glass.png', 'chars/hero.bin']);

  it('finds a side file beside the main file, as on disk', () => {
    expect(findSidePath('props/lamp.gltf', 'lamp.bin', dropped)).toBe('props/lamp.bin');
    expect(findSidePath('props/lamp.gltf', 'textures/glass.png', dropped)).toBe('props/textures/glass.png');
  });

  it('finds a file picked without its folder by its name', () => {
    const picked = new Set(['lamp.gltf', 'lamp.bin', 'glass.png']);
    expect(findSidePath('lamp.gltf', 'textures/glass.png', picked)).toBe('glass.png');
  });

  it('does not guess between two dropped files with the same name', () => {
    const twins = new Set(['a/hero.gltf', 'b/shared.bin', 'c/shared.bin']);
    expect(findSidePath('a/hero.gltf', 'buffers/shared.bin', twins)).toBeNull();
  });

  it('answers null for a side file that was not dropped', () => {
    expect(findSidePath('props/lamp.gltf', 'missing.bin', dropped)).toBeNull();
  });
});

describe('isAssetPath', () => {
  it.each([
    { path: 'hero.glb', expected: true },
    { path: 'props/LAMP.GLTF', expected: true },
    { path: 'lamp.bin', expected: false },
    { path: 'glass.png', expected: false }
  ])('says $expected for $path', ({ path, expected }) => {
    expect(isAssetPath(path)).toBe(expected);
  });
});

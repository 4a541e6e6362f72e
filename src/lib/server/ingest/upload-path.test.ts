import { describe, expect, it } from 'vitest';
import { ApiError } from './api-error';
import { validateUploadPath } from './upload-path';

describe('validateUploadPath', () => {
  it.each([
    'hero.glb',
    'chars/hero.gltf',
    'chars/textures/hero base.png',
    'a/b/c/d/e.bin',
    'chars/..hero.bin',
    `chars/${'x'.repeat(251)}.glb`
  ])('accepts the relative path %j unchanged', (path) => {
    expect(validateUploadPath(path)).toBe(path);
  });

  it.each([
    { path: '', reason: 'empty' },
    { path: '/etc/passwd', reason: 'absolute' },
    { path: 'C:/assets/hero.glb', reason: 'drive letter' },
    { path: '../hero.glb', reason: '".."' },
    { path: 'chars/../../hero.glb', reason: '".."' },
    { path: 'chars/./hero.glb', reason: '"."' },
    { path: 'chars\\hero.glb', reason: 'backslash' },
    { path: 'chars//hero.glb', reason: 'empty segment' },
    { path: 'chars/', reason: 'empty segment' },
    { path: 'hero\u0000.glb', reason: 'NUL' },
    { path: 'hero\n.glb', reason: 'control character' },
    { path: 'a/'.repeat(600) + 'x.glb', reason: 'longer than 1024' },
    // 'é' is 2 bytes in UTF-8 (RFC 3629), so 128 of them make a 260-byte name, over ext4's 255 (NAME_MAX).
    { path: `chars/${'é'.repeat(128)}.glb`, reason: 'longer than 255 bytes' }
  ])('refuses $path with a 400 saying it is $reason', ({ path, reason }) => {
    let thrown: unknown;
    try {
      validateUploadPath(path);
    } catch (error) {
      thrown = error;
    }
    expect(thrown).toBeInstanceOf(ApiError);
    const apiError = thrown as ApiError;
    expect(apiError.status).toBe(400);
    expect(apiError.code).toBe('upload.path-invalid');
    expect(apiError.message).toContain(reason);
    expect(apiError.message).not.toContain('\u0000');
    expect(apiError.message).not.toContain('\n');
  });
});

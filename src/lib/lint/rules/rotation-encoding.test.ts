import { describe, expect, it } from 'vitest';
import { rotationEncoding } from './rotation-encoding';
import { channelFrom, runOnChannels } from './testing';

const quats = [
  [0, 0, 0, 1],
  [0, 0, 0, 1]
];

function findingsFor(raw: { outputType?: string; componentType?: number; normalized?: boolean }) {
  return runOnChannels(rotationEncoding, [channelFrom({ interpolation: 'LINEAR', quats, raw })]);
}

describe('rotation-encoding', () => {
  // glTF 2.0 §3.11 table: rotation is VEC4 float, or signed/unsigned byte/short normalized.
  it.each([
    { componentType: 5126, normalized: false },
    { componentType: 5120, normalized: true },
    { componentType: 5121, normalized: true },
    { componentType: 5122, normalized: true },
    { componentType: 5123, normalized: true }
  ])('accepts VEC4 with componentType $componentType, normalized $normalized', (raw) => {
    expect(findingsFor(raw)).toEqual([]);
  });

  it('reports a VEC3 output', () => {
    const findings = findingsFor({ outputType: 'VEC3' });
    expect(findings).toHaveLength(1);
    expect(findings[0]).toMatchObject({ severity: 'error', keys: null, values: { outputType: 'VEC3' } });
  });

  it('reports integer components that are not normalized (a stored 127 would read as 127)', () => {
    expect(findingsFor({ componentType: 5122, normalized: false })[0].message).toContain('not marked normalized');
  });

  it('reports unsigned int components and normalized floats', () => {
    expect(findingsFor({ componentType: 5125, normalized: true })[0].message).toContain('unsigned int');
    expect(findingsFor({ componentType: 5126, normalized: true })[0].message).toContain(
      'float components are marked normalized'
    );
  });
});

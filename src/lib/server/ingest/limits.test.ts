import { describe, expect, it } from 'vitest';
import { INGEST_LIMIT_DEFAULTS, IngestLimitsError, parseIngestLimits } from './limits';

// Binary units (1 KiB = 1024 bytes) are common practice for upload limits.
const KIB = 1024;
const MIB = 1024 * KIB;
const GIB = 1024 * MIB;

describe('parseIngestLimits', () => {
  it('uses the defaults when nothing is set', () => {
    expect(parseIngestLimits({})).toEqual({
      maxFileBytes: 256 * MIB,
      maxFiles: 500,
      maxBuildBytes: GIB,
      maxMetaBytes: 64 * KIB
    });
    expect(parseIngestLimits({})).toEqual(INGEST_LIMIT_DEFAULTS);
  });

  it.each([
    { env: { ORIENTRY_MAX_FILE_BYTES: '1048576' }, key: 'maxFileBytes', expected: MIB },
    { env: { ORIENTRY_MAX_FILE_BYTES: '64M' }, key: 'maxFileBytes', expected: 64 * MIB },
    { env: { ORIENTRY_MAX_FILE_BYTES: '64mib' }, key: 'maxFileBytes', expected: 64 * MIB },
    { env: { ORIENTRY_MAX_BUILD_BYTES: '2G' }, key: 'maxBuildBytes', expected: 2 * GIB },
    { env: { ORIENTRY_MAX_BUILD_BYTES: ' 2 GB ' }, key: 'maxBuildBytes', expected: 2 * GIB },
    { env: { ORIENTRY_MAX_META_BYTES: '512k' }, key: 'maxMetaBytes', expected: 512 * KIB },
    { env: { ORIENTRY_MAX_META_BYTES: '100b' }, key: 'maxMetaBytes', expected: 100 },
    { env: { ORIENTRY_MAX_FILES: '20' }, key: 'maxFiles', expected: 20 },
    { env: { ORIENTRY_MAX_FILES: '' }, key: 'maxFiles', expected: 500 }
  ] as const)('reads $env into $key = $expected', ({ env, key, expected }) => {
    expect(parseIngestLimits(env)[key]).toBe(expected);
  });

  it.each([
    { env: { ORIENTRY_MAX_FILE_BYTES: 'lots' }, variable: 'ORIENTRY_MAX_FILE_BYTES' },
    { env: { ORIENTRY_MAX_FILE_BYTES: '-5' }, variable: 'ORIENTRY_MAX_FILE_BYTES' },
    { env: { ORIENTRY_MAX_FILE_BYTES: '0' }, variable: 'ORIENTRY_MAX_FILE_BYTES' },
    { env: { ORIENTRY_MAX_BUILD_BYTES: '1.5G' }, variable: 'ORIENTRY_MAX_BUILD_BYTES' },
    { env: { ORIENTRY_MAX_BUILD_BYTES: '5T' }, variable: 'ORIENTRY_MAX_BUILD_BYTES' },
    { env: { ORIENTRY_MAX_FILES: '10K' }, variable: 'ORIENTRY_MAX_FILES' },
    { env: { ORIENTRY_MAX_FILES: '0' }, variable: 'ORIENTRY_MAX_FILES' },
    { env: { ORIENTRY_MAX_META_BYTES: 'Infinity' }, variable: 'ORIENTRY_MAX_META_BYTES' }
  ])('refuses $env naming $variable', ({ env, variable }) => {
    expect(() => parseIngestLimits(env)).toThrow(IngestLimitsError);
    expect(() => parseIngestLimits(env)).toThrow(new RegExp(`^${variable}: .*got "${Object.values(env)[0]}"`));
  });
});

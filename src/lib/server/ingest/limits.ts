/**
 * Upload limits of the build ingest route, read from the environment. The route enforces them
 * itself while streaming, so a client learns which limit it hit (413/400 naming it) instead of
 * a bare connection reset.
 */
import { z } from 'zod';

/** The limits one build upload must respect. */
export interface IngestLimits {
  /** Largest single file, in bytes (`ORIENTRY_MAX_FILE_BYTES`). */
  maxFileBytes: number;
  /** Most files in one build (`ORIENTRY_MAX_FILES`). */
  maxFiles: number;
  /** Largest sum of all file sizes in one build, in bytes (`ORIENTRY_MAX_BUILD_BYTES`). */
  maxBuildBytes: number;
  /** Largest `meta` JSON part, in bytes (`ORIENTRY_MAX_META_BYTES`). */
  maxMetaBytes: number;
}

const MIB = 1024 * 1024;

/** Defaults: big enough for a real character with textures, small enough to stop a runaway upload. */
export const INGEST_LIMIT_DEFAULTS: IngestLimits = {
  maxFileBytes: 256 * MIB,
  maxFiles: 500,
  maxBuildBytes: 1024 * MIB,
  maxMetaBytes: 64 * 1024
};

/** Environment variable of each limit. */
export const INGEST_LIMIT_VARIABLES: Record<keyof IngestLimits, string> = {
  maxFileBytes: 'ORIENTRY_MAX_FILE_BYTES',
  maxFiles: 'ORIENTRY_MAX_FILES',
  maxBuildBytes: 'ORIENTRY_MAX_BUILD_BYTES',
  maxMetaBytes: 'ORIENTRY_MAX_META_BYTES'
};

/** A limit variable that is set but not a positive whole number of bytes or files. */
export class IngestLimitsError extends Error {
  readonly code = 'config.invalid';
  constructor(message: string, options?: { cause?: unknown }) {
    super(message, options);
    this.name = 'IngestLimitsError';
  }
}

const UNIT_FACTORS: Record<string, number> = { '': 1, k: 1024, m: MIB, g: 1024 * MIB };

/** A byte size such as `1048576`, `512K`, `256M`, `1G` (binary units, case-insensitive, optional `B`/`iB`). */
const byteSize = z
  .string()
  .trim()
  .regex(/^\d+\s*([kmg](i?b)?|b)?$/i, 'expected a whole number of bytes, optionally with K, M or G (e.g. 256M)')
  .transform((text) => {
    const match = /^(\d+)\s*([kmg]?)/i.exec(text)!;
    return Number(match[1]) * UNIT_FACTORS[match[2].toLowerCase()];
  })
  .pipe(z.number().int().positive().max(Number.MAX_SAFE_INTEGER));

const count = z
  .string()
  .trim()
  .regex(/^\d+$/, 'expected a whole number')
  .transform(Number)
  .pipe(z.number().int().positive().max(1_000_000));

/**
 * Reads the ingest limits from an environment map, with defaults for unset or empty variables.
 *
 * @example parseIngestLimits({ ORIENTRY_MAX_FILES: '20' }).maxFiles → 20
 * @example parseIngestLimits({ ORIENTRY_MAX_FILE_BYTES: '64M' }).maxFileBytes → 67108864
 * @throws IngestLimitsError naming the variable, its value and what is accepted.
 */
export function parseIngestLimits(env: Record<string, string | undefined>): IngestLimits {
  const limits = { ...INGEST_LIMIT_DEFAULTS };
  for (const key of Object.keys(INGEST_LIMIT_VARIABLES) as (keyof IngestLimits)[]) {
    const name = INGEST_LIMIT_VARIABLES[key];
    const raw = env[name];
    if (raw === undefined || raw.trim() === '') continue;
    const result = (key === 'maxFiles' ? count : byteSize).safeParse(raw);
    if (!result.success) {
      const reason = result.error.issues[0]?.message ?? 'invalid value';
      throw new IngestLimitsError(
        `${name}: ${reason}, got "${raw}". Fix the variable or unset it to use the default.`,
        {
          cause: result.error
        }
      );
    }
    limits[key] = result.data;
  }
  return limits;
}

/** The limits for this process, read from `process.env` on each call so tests may change them. */
export function getIngestLimits(): IngestLimits {
  return parseIngestLimits(process.env);
}

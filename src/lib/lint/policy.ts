/**
 * The lint policy: every tolerance, severity and convention a project can set.
 * This zod schema is the one source of the defaults, their documentation and CLI help;
 * a project stores one on the server and the CLI reads one from `--policy file.json`.
 */
import { z } from 'zod';
import { RULE_IDS, type RuleId } from './rule-ids';
import { SEVERITIES, type Severity } from './finding';
import { fnv1a64 } from './hash';

/** Euler orders an engine may store rotations in (intrinsic, as three.js names them). */
export const EULER_ORDERS = ['XYZ', 'XZY', 'YXZ', 'YZX', 'ZXY', 'ZYX'] as const;
export type EulerOrder = (typeof EULER_ORDERS)[number];

const severityOrOff = z.enum([...SEVERITIES, 'off']);
export type SeverityOrOff = z.infer<typeof severityOrOff>;

const positive = (max: number) => z.number().positive().max(max);

export const policySchema = z
  .object({
    /** Schema version of the policy document itself. */
    version: z.literal(1).default(1),
    tolerances: z
      .object({
        /**
         * |length - 1| above this is a warning. 1e-3 because a quaternion of length 1+e
         * applied as q v q* scales v by (1+e)^2: 1e-3 is a 0.2% scale, the edge of what shows on a long limb.
         */
        unitWarning: positive(0.5).default(1e-3),
        /** |length - 1| above this is an error (about 2% scale: visible). */
        unitError: positive(0.5).default(1e-2),
        /** A length below this is no rotation at all (not-a-rotation). */
        zeroLength: positive(0.5).default(1e-6),
        /** Largest 4D distance between q(k+1) and -q(k) that still counts as antipodal. */
        antipodal: positive(0.5).default(1e-3),
        /** Angle in degrees within which interpolation reproduces a key (redundant-keys). */
        redundantDegrees: positive(10).default(0.01)
      })
      .default({ unitWarning: 1e-3, unitError: 1e-2, zeroLength: 1e-6, antipodal: 1e-3, redundantDegrees: 0.01 }),
    /** Rotation between consecutive keys above this many degrees raises wide-arc. */
    wideArcDegrees: z.number().min(90).max(180).default(150),
    /** Angular speed ceiling for spin-spike, in degrees per second (4 turns per second by default). */
    maxSpeedDegreesPerSecond: z.number().positive().default(1440),
    /** A spike must also exceed the channel's median speed by this factor. */
    spinSpikeMedianFactor: z.number().min(1).default(8),
    /** spline-dip: an un-normalized CUBICSPLINE curve shorter than this between keys sags too far. */
    splineMinLength: z.number().min(0).max(1).default(0.9),
    convention: z
      .object({
        /** Assets must be authored in glTF's own basis (right-handed, +Y up, front +Z; spec §3.4). */
        requireGltfBasis: z.boolean().default(true),
        /**
         * baked-basis: how close (rotation angle, degrees) a root's rest rotation must be to an exact
         * quarter or half turn about X, Y or Z to count as a baked basis correction. Exporters write
         * such turns exactly, so 0.5° only absorbs float rounding.
         */
        basisToleranceDegrees: z.number().min(0).max(45).default(0.5),
        /**
         * clip-basis-offset: how far (rotation angle, degrees) each key of a root channel may stray
         * from one quarter or half turn away from the rest rotation. 20° leaves room for a root's
         * own sway while a real 90° offset still stands out.
         */
        clipOffsetToleranceDegrees: z.number().min(0).max(45).default(20)
      })
      .default({ requireGltfBasis: true, basisToleranceDegrees: 0.5, clipOffsetToleranceDegrees: 20 }),
    engine: z
      .object({
        /** How the target engine stores rotation curves. */
        rotationStorage: z.enum(['quaternion', 'euler']).default('quaternion'),
        /** Euler order when rotationStorage is `euler`. */
        eulerOrder: z.enum(EULER_ORDERS).default('XYZ'),
        /** Keys whose middle angle lies within this many degrees of ±90 raise gimbal-proximity. */
        gimbalMarginDegrees: z.number().positive().max(45).default(5)
      })
      .default({ rotationStorage: 'quaternion', eulerOrder: 'XYZ', gimbalMarginDegrees: 5 }),
    /** Per-rule severity overrides; `off` disables a rule. */
    rules: z.partialRecord(z.enum(RULE_IDS), severityOrOff).default({}),
    gate: z
      .object({
        /** Lowest severity that fails the gate. */
        failOn: z.enum(SEVERITIES).default('error'),
        /** `new`: only findings absent from the baseline fail; `all`: any finding does. */
        scope: z.enum(['new', 'all']).default('new')
      })
      .default({ failOn: 'error', scope: 'new' }),
    /** Asset path globs to lint (picomatch syntax); empty means every asset. */
    include: z.array(z.string().min(1)).default([]),
    /** Asset path globs to skip. */
    exclude: z.array(z.string().min(1)).default([])
  })
  .strict()
  .refine((p) => p.tolerances.unitError >= p.tolerances.unitWarning, {
    path: ['tolerances', 'unitError'],
    message: 'must be at least tolerances.unitWarning'
  });

export type Policy = z.infer<typeof policySchema>;
export type PolicyInput = z.input<typeof policySchema>;

/** The default policy, as a fresh object. */
export function defaultPolicy(): Policy {
  return policySchema.parse({});
}

/** An invalid policy: the message names the field and what is allowed. */
export class PolicyError extends Error {
  readonly code = 'policy.invalid';
  constructor(
    message: string,
    readonly issues: { path: string; message: string }[],
    options?: { cause?: unknown }
  ) {
    super(message, options);
    this.name = 'PolicyError';
  }
}

/**
 * Parses and validates a policy, filling defaults.
 * @throws PolicyError naming each bad field, e.g.
 *   `policy.tolerances.unitWarning: expected number, received string. Fix the policy or remove the field.`
 */
export function parsePolicy(input: unknown): Policy {
  const result = policySchema.safeParse(input ?? {});
  if (result.success) return result.data;
  const issues = result.error.issues.map((issue) => ({
    path: ['policy', ...issue.path.map(String)].join('.'),
    message: issue.message
  }));
  const text = issues.map((i) => `${i.path}: ${i.message}`).join('; ');
  throw new PolicyError(`${text}. Fix the policy or remove the field to use its default.`, issues, {
    cause: result.error
  });
}

/** The effective severity of a rule under a policy (`off` when disabled). */
export function severityFor(policy: Policy, rule: RuleId, defaultSeverity: Severity): SeverityOrOff {
  return policy.rules[rule] ?? defaultSeverity;
}

/**
 * A short stable version of a policy's content (16 hex digits), so stored findings are
 * reused only for an asset linted under the same policy and engine version.
 */
export function policyVersionOf(policy: Policy): string {
  return fnv1a64(canonicalJson(policy));
}

/** JSON with object keys sorted at every level, so equal policies give equal text. */
function canonicalJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
  if (value && typeof value === 'object') {
    const entries = Object.entries(value).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(',')}}`;
  }
  return JSON.stringify(value);
}

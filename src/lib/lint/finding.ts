import { fnv1a64 } from './hash';

/**
 * A finding is one thing wrong (or worth knowing) about a rotation in one asset.
 * Every surface — CLI, server, browser — speaks in findings, so this file is the
 * shared vocabulary; keep it small and stable.
 */

/** Severities in falling order of weight; `off` only exists in policies, never on a finding. */
export const SEVERITIES = ['error', 'warning', 'info'] as const;
export type Severity = (typeof SEVERITIES)[number];

/** Severity rank for comparisons: higher is worse. */
export const SEVERITY_RANK: Record<Severity, number> = { error: 3, warning: 2, info: 1 };

/** True when `severity` is at least as heavy as `threshold`. */
export function isAtLeast(severity: Severity, threshold: Severity): boolean {
  return SEVERITY_RANK[severity] >= SEVERITY_RANK[threshold];
}

/** Values a finding carries for the reader (norms, angles, dot products); kept JSON-friendly. */
export type FindingValues = Record<string, number | string | boolean | number[] | null>;

export interface Finding {
  /** Rule id, kebab-case (see rules/index.ts). */
  rule: string;
  severity: Severity;
  /** Asset path as submitted (forward slashes, relative to the build root). */
  asset: string;
  /** Animation name, or `#<index>` when it has none; null for node-level findings. */
  animation: string | null;
  /** Channel index within the animation; null for node-level findings. */
  channel: number | null;
  /** Node path of names from the scene root, e.g. `/Hero/Hips/Spine`; null for asset-level findings. */
  node: string | null;
  /** First and last key index involved (inclusive); null when not about keys. */
  keys: [number, number] | null;
  /** Time in seconds of the first key involved; null when not about keys. */
  time: number | null;
  values: FindingValues;
  /** What is wrong, in one or two sentences, with the values involved. */
  message: string;
  /** How to fix it. */
  hint: string;
  /** Stable identity for baselines and waivers: see {@link fingerprintOf}. */
  fingerprint: string;
}

/** The parts of a finding that identify it across builds. */
export interface FingerprintParts {
  rule: string;
  asset: string;
  animation: string | null;
  node: string | null;
  /** Channel target path (`rotation`) or another discriminator such as a skin index. */
  target?: string | null;
  /** Time of the first key in seconds; rounded to milliseconds so re-exports that only shift key indices keep it. */
  time?: number | null;
}

/**
 * A stable fingerprint: FNV-1a (64-bit) over the identifying parts, as 16 hex digits.
 * Key indices are left out on purpose: a re-export that inserts a key earlier in the clip
 * shifts every index but not the time or the node, and a waiver must survive that.
 * Pure and synchronous so the browser and the CLI compute the same value as the server.
 */
export function fingerprintOf(parts: FingerprintParts): string {
  const time = parts.time == null || !Number.isFinite(parts.time) ? '' : Math.round(parts.time * 1000).toString();
  const text = [parts.rule, parts.asset, parts.animation ?? '', parts.node ?? '', parts.target ?? '', time].join(
    '\u001f'
  );
  return fnv1a64(text);
}

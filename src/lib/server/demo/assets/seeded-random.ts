/**
 * A small seeded pseudo-random generator (mulberry32) for the demo: the same seed gives the
 * same studio history on every run, which `Math.random` could never promise.
 */
import { fnv1a64 } from '$lib/lint/hash';

/** A function returning numbers in [0, 1), fully determined by `seed` (a 32-bit integer). */
export function createSeededRandom(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A 32-bit seed derived from text, so seeds can be named (`'kelp-diver#3'`). */
export function seedFromText(text: string): number {
  return Number.parseInt(fnv1a64(text).slice(8), 16) >>> 0;
}

/** `digitCount` lowercase hex digits drawn from `random` (e.g. 40 for a commit SHA). */
export function randomHex(random: () => number, digitCount: number): string {
  let hex = '';
  while (hex.length < digitCount) hex += Math.floor(random() * 16).toString(16);
  return hex;
}

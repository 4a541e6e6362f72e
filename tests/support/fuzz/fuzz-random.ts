/**
 * The seeded random source of the fuzz tests: mulberry32 (the demo's generator) with the few
 * draws the generators need. The same seed gives the same files on every run and machine, so a
 * failure names a case index that reproduces.
 */
import { createSeededRandom } from '$lib/server/demo/assets/seeded-random';

/** Draws from one seeded stream. */
export interface FuzzRandom {
  /** A float in [0, 1). */
  next(): number;
  /** An integer in [min, max], both included. */
  integer(min: number, max: number): number;
  /** True with probability `p`. */
  chance(p: number): boolean;
  /** One element of a non-empty list. */
  pick<T>(items: readonly T[]): T;
  /** `byteLength` random bytes. */
  bytes(byteLength: number): Uint8Array;
}

/** A random stream fully determined by `seed` (a 32-bit integer). */
export function createFuzzRandom(seed: number): FuzzRandom {
  const next = createSeededRandom(seed);
  const integer = (min: number, max: number) => min + Math.floor(next() * (max - min + 1));
  return {
    next,
    integer,
    chance: (p) => next() < p,
    pick: (items) => items[integer(0, items.length - 1)],
    bytes(byteLength) {
      const bytes = new Uint8Array(byteLength);
      for (let index = 0; index < byteLength; index++) bytes[index] = integer(0, 255);
      return bytes;
    }
  };
}

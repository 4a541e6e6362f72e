/**
 * The vocabulary of the channel digest: which rule a mark is for, the shortest run of redundant
 * keys it records, and the three outcomes of its redundancy test. Kept apart from the pass so the
 * scan loops and the rules can share it without importing each other.
 */

/** What a mark asks a rule to look at; marks combine as bit flags. */
export const MARK = {
  /** Key k's time is not later than key k−1's (or the first or last time is bad). */
  keyTimes: 1,
  /** Key k is NaN, infinite or shorter than tolerances.zeroLength. */
  notARotation: 2,
  /** Key k has a NaN or infinite CUBICSPLINE tangent. */
  tangent: 4,
  /** Key k's length is off 1 by more than the unit-drift warning tolerance (grown for quantized keys). */
  unitDrift: 8,
  /** Keys k−1 and k have a negative dot product (not marked on STEP channels, nor are the next four). */
  hemisphereJump: 16,
  /** Key k is within tolerances.antipodal of −key k−1. */
  antipodalKeys: 32,
  /** Keys k−1 and k are more than wideArcDegrees apart. */
  wideArc: 64,
  /** Candidate: keys k−1 and k may turn faster than maxSpeedDegreesPerSecond. */
  spinSpike: 128,
  /** Candidate: the CUBICSPLINE curve between keys k−1 and k may sag below splineMinLength. */
  splineDip: 256,
  /** Key k lies in a candidate run of redundant keys but the pass could not decide it. */
  redundantKeys: 512
} as const;

/** Shortest run of redundant keys the pass records (and redundant-keys reports). */
export const REDUNDANT_MIN_RUN = 4;

/** Outcome of the redundancy test for one key. */
export const REDUNDANCY = { no: 0, yes: 1, undecided: 2 } as const;

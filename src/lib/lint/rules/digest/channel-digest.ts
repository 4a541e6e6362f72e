/**
 * One fused pass over a rotation channel's keys that evaluates every key-level rule's test at
 * once and records which keys each rule has to look at. Rules read the digest and visit only the
 * keys it marked, which on clean assets is none.
 *
 * Design notes. The rule pass must lint ≥ 100 million keys per second (≈ 10 ns per key for all
 * rules), and a bare loop that loads four floats per key already costs ≈ 2.5 ns on the reference
 * machine. Measured on 10,000-key channels (best of 300 runs, one process per variant):
 * - each rule looping on its own: over budget before any rule did real work;
 * - one pass keeping conservative extremes (normalized cosines, a square root and divisions per
 *   key), with rules re-scanning a whole channel whenever an extreme looked suspicious: 10 ns per
 *   LINEAR key and 21 ns per CUBICSPLINE key for the pass alone, and one defect anywhere sent three
 *   or four rules over all keys again;
 * - redundant-keys checked exactly after a cheap screen: on smooth, densely baked clips half the
 *   keys are redundant and the exact checks alone cost 20 ms per 2 million keys.
 * So here every test is squared, needing no root or division (|cos|² = dot²/(|a|²|b|²)), the
 * pass records marks instead of extremes, and it decides redundancy itself: sure, not, or
 * ambiguous, with only ambiguous keys left to the rule's exact test.
 * Marks are either exact (the rule's own test: key-times, not-a-rotation, unit-drift,
 * hemisphere-jump, antipodal-keys, wide-arc) or conservative candidates the rule then checks
 * (spin-spike, spline-dip): a candidate test may pass segments the rule drops, never miss one the
 * rule would report. NaN keys fail every comparison, which matches the rules: they leave keys that
 * are not finite to not-a-rotation.
 * V8 compiles the loops once they are hot; the module primes every branch with a tiny channel
 * first (see primeTypeFeedback), because code the optimizer has never seen run deoptimizes when it
 * first runs, and after on-stack replacement that measured up to 4× slower for the rest of the
 * process. Digests are cached per channel object and policy in a WeakMap; channels are read once
 * and never mutated afterwards.
 * Later measurements (engine benchmark asset, 150 LINEAR + 50 CUBICSPLINE channels of 10,000 keys,
 * on a shared 2-core machine whose load average sat at 7 to 11, so only large effects are real):
 * - one builder per pass let a major GC deoptimize both scan loops (see sharedBuilder); with a
 *   full GC before each pass the digests measured 82 ms (LINEAR) + 50 ms (CUBICSPLINE) fastest,
 *   33 + 13 ms without it. With the shared builder the GC no longer matters: the same benchmark
 *   at the same load took 115 ms median CPU time for the rule pass before, 62 ms after.
 * - the digests after that: 30–45 ms for the 1.5 million LINEAR keys and 13–18 ms for the 0.5
 *   million CUBICSPLINE keys (fastest runs); the rules' own work on the marks 7–10 ms. A loop that
 *   only reads every value (and tangent) takes 12–17 ms, so the 20 ms budget of 100 million keys
 *   per second leaves 3–8 ms for every test of every rule: out of reach for these loops here.
 * - within the LINEAR pass (same process, variants interleaved): the defect marks cost about 15%,
 *   the redundancy test about a third; loads, lengths and dots the rest.
 * - rejected: slerpOutcome inlined into the loop (within ±3%, no gain); a division-free bound that
 *   settles keys whose slack is under a quarter of the tolerance before calling slerpOutcome
 *   (same outcomes, 6–8% slower: the extra arithmetic runs on every key the call would skip).
 * WebAssembly, measured outside the project on the LINEAR pass (150 smooth channels of 10,000
 * keys, AssemblyScript 0.28 at -O3, Node 20; each channel copied into the module's memory first,
 * 3.5 ms of the figures):
 * - this loop ported as it is (scalar f64, same marks and runs): 38 ms against 37 ms here;
 * - two keys per f64x2 SIMD vector with branch-free tests (marks and runs bit for bit equal to
 *   this loop's): 28 ms; V8 compiles it with many spills (about 26 live vectors for 16 registers);
 * - four keys per f32x4 vector, as a screen only (which keys may carry a mark or an undecided
 *   redundancy, each then to be settled in f64): 8 ms. Float32 cannot carry the redundancy test
 *   as it is written here (1 − cos of 0.01° is below its resolution); the screen compares chords
 *   of normalized quaternions instead, good to about 1e-6 against a tolerance near 1e-4.
 * Projected with the CUBICSPLINE pass, the copies and the rules' own work on the marks, the f32x4
 * route lands near 75–85 million keys per second; above 100 million it needs the file's bytes
 * to live in the module's memory from the read on (no copy per channel), and every Document and
 * channel that views them must then be tied to that memory's lifetime. Not done: that is a
 * second engine beside this one for the browser, the server and the CLI.
 */
import type { Policy } from '../../policy';
import type { RotationChannel } from '../../read/rotation-channel';
import { DigestBuilder } from './digest-builder';
import { MARK } from './digest-marks';
import { thresholdsFor } from './digest-thresholds';
import { scanLinearOrStep } from './scan-linear-keys';
import { scanCubic } from './scan-cubic-keys';

/** What one pass over a channel found, for the policy it ran under. */
export interface ChannelDigest {
  policy: Policy;
  /** Bitwise OR of every mark: a rule whose bit is clear has nothing to look at. */
  flags: number;
  /** (mark bits, key index) pairs in ascending key order; `markCount` pairs are used. */
  marks: Int32Array;
  markCount: number;
  /**
   * (first, last) runs of at least REDUNDANT_MIN_RUN consecutive interior keys that are redundant
   * or undecided (marked `redundantKeys`), in ascending order; `runCount` pairs are used.
   */
  runs: Int32Array;
  runCount: number;
}

export { MARK, REDUNDANCY, REDUNDANT_MIN_RUN } from './digest-marks';

const cache = new WeakMap<RotationChannel, ChannelDigest>();

/**
 * The one builder every pass writes into; each digest keeps copies of its used marks and runs.
 * Reused on purpose: a builder per channel died after each pass, and a major GC that found no
 * builder left collected the builder's object shape, which deoptimized both compiled scan loops
 * (V8 drops optimized code that embeds a collected shape). They then ran unoptimized until V8
 * compiled them again, which measured 2.5–4× slower on the next lint of the engine benchmark.
 */
const sharedBuilder = new DigestBuilder();

/** The digest of `channel` under `policy`, computed on first use and cached for the channel's lifetime. */
export function getChannelDigest(channel: RotationChannel, policy: Policy): ChannelDigest {
  let digest = cache.get(channel);
  if (digest === undefined || digest.policy !== policy) {
    digest = computeDigest(channel, policy);
    cache.set(channel, digest);
  }
  return digest;
}

/** Calls `visit` with each key index that carries `mark`, in ascending order. */
export function forEachMarkedKey(digest: ChannelDigest, mark: number, visit: (keyIndex: number) => void): void {
  if ((digest.flags & mark) === 0) return;
  const { marks, markCount } = digest;
  for (let i = 0; i < markCount; i++) if ((marks[2 * i] & mark) !== 0) visit(marks[2 * i + 1]);
}

function computeDigest(channel: RotationChannel, policy: Policy): ChannelDigest {
  const { interpolation, values, inTangents, outTangents, times, keyCount } = channel;
  const thresholds = thresholdsFor(channel, policy);
  const builder = sharedBuilder;
  builder.reset();
  if (interpolation === 'CUBICSPLINE' && inTangents !== null && outTangents !== null) {
    scanCubic(values, inTangents, outTangents, times, keyCount, thresholds, builder);
  } else {
    scanLinearOrStep(values, times, keyCount, interpolation === 'STEP', thresholds, builder);
  }
  // The scans check that times strictly increase; with finite ends at or after zero, all are.
  if (keyCount > 0 && !(times[0] >= 0 && times[keyCount - 1] < Infinity)) builder.flags |= MARK.keyTimes;
  return {
    policy,
    flags: builder.flags,
    marks: builder.marks.slice(0, 2 * builder.markCount),
    markCount: builder.markCount,
    runs: builder.runs.slice(0, 2 * builder.runCount),
    runCount: builder.runCount
  };
}

/**
 * Runs the pass a few times per interpolation on a tiny channel that trips every test when the
 * module loads, so every branch has type feedback before the optimizer compiles the loops. V8 only
 * starts recording feedback after a function's first few calls, hence the rounds.
 */
function primeTypeFeedback(): void {
  const { values, times, tangents, keyCount } = primingKeys();
  for (let round = 0; round < PRIMING_ROUNDS; round++) {
    // The full channel, and the same channel cut short inside a steady turn so a run is still open at its end.
    for (const count of [keyCount, 10]) {
      for (const interpolation of ['LINEAR', 'STEP', 'CUBICSPLINE'] as const) {
        const isCubic = interpolation === 'CUBICSPLINE';
        computeDigest(
          {
            animation: '',
            animationIndex: 0,
            channelIndex: 0,
            nodePath: '',
            nodeIndex: 0,
            interpolation,
            times,
            values,
            inTangents: isCubic ? tangents : null,
            outTangents: isCubic ? tangents : null,
            keyCount: count,
            raw: { inputCount: count, outputCount: count, outputType: 'VEC4', componentType: 5126, normalized: false },
            quantizationStep: 0,
            restRotation: [0, 0, 0, 1],
            isRoot: false
          },
          PRIMING_POLICY
        );
      }
    }
  }
}

/**
 * Keys that take every branch: twelve steady-turn blocks of five keys (redundant runs, enough to
 * grow the run list), forty alternating flips (enough marks to grow the mark list), then a spin,
 * an antipode, a drifted key, a zero key and a NaN key, a repeated time and a NaN time.
 */
function primingKeys(): { values: Float32Array; times: Float32Array; tangents: Float32Array; keyCount: number } {
  const keyCount = 112;
  const values = new Float32Array(keyCount * 4);
  const times = new Float32Array(keyCount);
  let angle = 0;
  for (let k = 0; k < keyCount; k++) {
    angle += k < 60 && k % 5 === 4 ? 0.3 : 0.01;
    const sign = k >= 60 && k < 100 && k % 2 === 1 ? -1 : 1;
    values.set([0, sign * Math.sin(angle), 0, sign * Math.cos(angle)], k * 4);
    times[k] = k / 30;
  }
  values.set([0, 1, 0, 0, 0, -1, 0, 0, 0, -1, 0, 0.1, 0, 0, 0, 0, NaN, 0, 0, 1], 102 * 4);
  times[106] = times[105];
  times[108] = NaN;
  const tangents = values.map((value) => value / 20);
  tangents.set([40, 40, 40, 40], 110 * 4);
  return { values, times, tangents, keyCount };
}

const PRIMING_ROUNDS = 16;

/** The default thresholds, written out so this module does not parse a policy at load time. */
const PRIMING_POLICY = {
  tolerances: { unitWarning: 1e-3, unitError: 1e-2, zeroLength: 1e-6, antipodal: 1e-3, redundantDegrees: 0.01 },
  wideArcDegrees: 150,
  maxSpeedDegreesPerSecond: 1440,
  splineMinLength: 0.9
} as Policy;

primeTypeFeedback();

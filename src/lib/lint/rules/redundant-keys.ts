/**
 * redundant-keys (info): runs of at least four interior keys that interpolating each key's two
 * neighbours already reproduces within tolerances.redundantDegrees (0.01°, rotation angle). Dense
 * bakes of held poses or steady turns are full of them; they cost bytes and decode time and change
 * nothing on screen. A key's neighbours are judged by the channel's own interpolation:
 * - STEP: the key repeats the pose of the key before it.
 * - LINEAR: slerp of the neighbours (glTF 2.0 Appendix C) at the key's time hits the key.
 * - CUBICSPLINE: the single cubic through the neighbours (their values and outer tangents) matches
 *   the key's value and both its tangents, so the two segments are one cubic; the allowed error
 *   bounds the whole curve (|Δv| + 4/27·t_d·|Δtangent|, see math/hermite.ts).
 * A run of r such keys is reported with ceil(r/2) removable for sure (every other key keeps both
 * its neighbours); more may go together, which the rule does not prove. First and last keys stay,
 * since they set the clip's length. Shorter runs are left alone: one or two keys that happen to sit
 * on a near-steady stretch of motion save next to nothing.
 *
 * Design notes. The channel digest (digest/) decides redundancy for every interior key in its single pass
 * (yes, no or undecided, see digest/scan-linear-keys.ts) and records runs of at least four keys;
 * this rule only settles the undecided keys exactly. On smooth, densely baked clips half of all
 * keys are redundant, and an exact test for each measured 20 ms per 2 million keys, twice the whole
 * budget of the rule pass. The exact LINEAR test compares the key with the normalized lerp of its
 * neighbours first, whose angle from their slerp is at most 0.25·φ³·u(1−u)|1−2u| for a 4D arc φ
 * (numeric maximum of the ratio 0.2215 over φ ≤ π/2; 0 at u = ½); only keys within that error of the
 * tolerance fall back to the exact slerp (acos and sines).
 * Source: glTF 2.0 Appendix C (slerp; cubic spline); common practice (key reduction).
 */
import type { RotationChannel } from '../read/rotation-channel';
import type { ChannelRule, RuleContext } from './rule';
import { MARK, REDUNDANT_MIN_RUN, getChannelDigest, type ChannelDigest } from './digest/channel-digest';
import { channelDraft, describePlace } from './channel-draft';
import { formatBytes, formatDegrees } from './format-number';
import { HERMITE_TANGENT_WEIGHT_MAX, hermiteInto, hermiteVelocityInto } from '../math/hermite';
import { dotAt, isUsableKey, lengthSquaredAt } from '../math/flat-keys';
import { slerpInto } from '../math/slerp';

/** Shortest run reported: the digest records no shorter one. */
const MIN_RUN = REDUNDANT_MIN_RUN;
const NLERP_ERROR_FACTOR = 0.25 * Math.pow(Math.PI / 2, 3);
const COMPONENT_BYTES: Record<number, number> = { 5120: 1, 5121: 1, 5122: 2, 5123: 2, 5126: 4 };
const point = new Float64Array(4);
const velocity = new Float64Array(4);
const unitA = new Float64Array(4);
const unitB = new Float64Array(4);

export const redundantKeys: ChannelRule = {
  id: 'redundant-keys',
  defaultSeverity: 'info',
  scope: 'channel',
  title: 'Runs of keys that interpolation already reproduces',
  rationale:
    'Keys that the interpolation between their neighbours reproduces within a hundredth of a degree change ' +
    'nothing on screen but cost file size, download and decode time. Dense bakes of held poses and steady turns ' +
    'are full of them.',
  source: 'glTF 2.0 Appendix C (slerp; cubic spline); common practice (key reduction)',
  check: checkRedundantKeys
};

interface Runs {
  count: number;
  keys: number;
  removable: number;
  first: number;
  last: number;
  longestFirst: number;
  longestLength: number;
}

function checkRedundantKeys(channel: RotationChannel, context: RuleContext): void {
  const keyCount = channel.keyCount;
  if (keyCount < MIN_RUN + 2) return;
  const digest = getChannelDigest(channel, context.policy);
  if (digest.runCount === 0) return;
  const toleranceDegrees = context.policy.tolerances.redundantDegrees;
  // The 4D angle between quaternions is half the rotation angle between the poses.
  const isRedundant = predicateFor(channel, (toleranceDegrees * Math.PI) / 360);
  const runs: Runs = { count: 0, keys: 0, removable: 0, first: -1, last: -1, longestFirst: -1, longestLength: 0 };
  collectRuns(digest, isRedundant, runs);
  if (runs.count === 0) return;

  const bytesPerKey =
    4 + (channel.interpolation === 'CUBICSPLINE' ? 3 : 1) * 4 * (COMPONENT_BYTES[channel.raw.componentType] ?? 4);
  const bytesSaved = runs.removable * bytesPerKey;
  const longestLast = runs.longestFirst + runs.longestLength - 1;
  context.emit(
    channelDraft(channel, {
      first: runs.first,
      last: runs.last,
      values: {
        redundantKeys: runs.keys,
        runs: runs.count,
        removableKeys: runs.removable,
        bytesSaved,
        longestRun: [runs.longestFirst, longestLast],
        toleranceDegrees
      },
      message:
        `${describePlace(channel, runs.first, runs.last)}: ${runs.keys} of ${keyCount} keys (in ${runs.count} ` +
        `run${runs.count === 1 ? '' : 's'}, the longest keys ${runs.longestFirst}–${longestLast}) are reproduced ` +
        `within ${formatDegrees(toleranceDegrees)} by ${channel.interpolation} interpolation of their neighbours. ` +
        `Removing at least ${runs.removable} of them saves ${formatBytes(bytesSaved)} without changing the motion.`,
      hint:
        'Simplify the curve on export (key reduction), or resample the clip with a tolerance, for example with ' +
        'glTF-Transform\u2019s resample(); keep the first and last keys.'
    })
  );
}

/**
 * Turns the digest's candidate runs into runs of redundant keys: inside a run every key is
 * redundant except undecided ones (marked), which get the exact test and split the run where they
 * fail. Pieces shorter than MIN_RUN are dropped.
 */
function collectRuns(digest: ChannelDigest, isRedundant: (k: number) => boolean, runs: Runs): void {
  const { marks, markCount } = digest;
  let markIndex = 0;
  for (let r = 0; r < digest.runCount; r++) {
    const first = digest.runs[2 * r];
    const last = digest.runs[2 * r + 1];
    let start = first;
    while (markIndex < markCount && marks[2 * markIndex + 1] < first) markIndex++;
    for (; markIndex < markCount && marks[2 * markIndex + 1] <= last; markIndex++) {
      if ((marks[2 * markIndex] & MARK.redundantKeys) === 0) continue;
      const keyIndex = marks[2 * markIndex + 1];
      if (isRedundant(keyIndex)) continue;
      addRun(runs, start, keyIndex - 1);
      start = keyIndex + 1;
    }
    addRun(runs, start, last);
  }
}

function addRun(runs: Runs, start: number, end: number): void {
  const length = end - start + 1;
  if (length < MIN_RUN) return;
  runs.count++;
  runs.keys += length;
  runs.removable += Math.ceil(length / 2);
  if (runs.first < 0) runs.first = start;
  runs.last = end;
  if (length > runs.longestLength) {
    runs.longestLength = length;
    runs.longestFirst = start;
  }
}

function predicateFor(channel: RotationChannel, tolerance: number): (k: number) => boolean {
  const { values, times, inTangents, outTangents } = channel;
  if (channel.interpolation === 'STEP') {
    const cosineLimit = Math.cos(tolerance);
    return (k) => repeatsPrevious(values, k, cosineLimit);
  }
  if (channel.interpolation === 'CUBICSPLINE' && inTangents !== null && outTangents !== null) {
    // A 4D chord of 2·sin(θ/2) between unit quaternions is a 4D angle of θ.
    const chordTolerance = 2 * Math.sin(tolerance / 2);
    return (k) => isOnSameCubic(values, times, inTangents, outTangents, k, chordTolerance);
  }
  return (k) => isOnSlerp(values, times, k, tolerance);
}

function repeatsPrevious(values: Float32Array, k: number, cosineLimit: number): boolean {
  const a = (k - 1) * 4;
  const b = k * 4;
  const lengthProduct = Math.sqrt(lengthSquaredAt(values, a) * lengthSquaredAt(values, b));
  if (!(lengthProduct > 0) || lengthProduct === Infinity) return false;
  return Math.abs(dotAt(values, a, b)) / lengthProduct >= cosineLimit;
}

/** Whether slerp of keys k−1 and k+1 at key k's time lands within `tolerance` (4D angle) of key k. */
function isOnSlerp(values: Float32Array, times: Float32Array, k: number, tolerance: number): boolean {
  const before = times[k] - times[k - 1];
  const after = times[k + 1] - times[k];
  if (!(before >= 0 && after > 0)) return false;
  const u = before / (before + after);
  const a = (k - 1) * 4;
  const q = k * 4;
  const b = (k + 1) * 4;
  const ia = 1 / Math.sqrt(lengthSquaredAt(values, a));
  const iq = 1 / Math.sqrt(lengthSquaredAt(values, q));
  let ib = 1 / Math.sqrt(lengthSquaredAt(values, b));
  // Zero, NaN or infinite keys give non-finite or zero inverse lengths: never redundant.
  if (!(ia * iq * ib < Infinity) || !(ia > 0 && iq > 0 && ib > 0)) return false;
  let cosine = dotAt(values, a, b) * ia * ib;
  // Appendix C's sign term: slerp heads for whichever of ±q_k+1 is nearer.
  if (cosine < 0) {
    cosine = -cosine;
    ib = -ib;
  }
  const wa = (1 - u) * ia;
  const wb = u * ib;
  const px = wa * values[a] + wb * values[b];
  const py = wa * values[a + 1] + wb * values[b + 1];
  const pz = wa * values[a + 2] + wb * values[b + 2];
  const pw = wa * values[a + 3] + wb * values[b + 3];
  const pLength = Math.sqrt(px * px + py * py + pz * pz + pw * pw);
  const cosineToKey =
    (Math.abs(px * values[q] + py * values[q + 1] + pz * values[q + 2] + pw * values[q + 3]) * iq) / pLength;
  const gap = 1 - cosineToKey; // 1 − cos d = 2·sin²(d/2)
  const oneMinusCosine = cosine < 1 ? 1 - cosine : 0;
  const nlerpError =
    NLERP_ERROR_FACTOR * oneMinusCosine * Math.sqrt(oneMinusCosine) * u * (1 - u) * Math.abs(1 - 2 * u);
  // d ≤ X when 1 − cos d ≤ X²/2·(1 − X²/12) ≤ 1 − cos X; d > Y when 1 − cos d > Y²/2 ≥ 1 − cos Y.
  const sure = tolerance - nlerpError;
  if (sure > 0 && gap <= ((sure * sure) / 2) * (1 - (sure * sure) / 12)) return true;
  const beyond = tolerance + nlerpError;
  if (gap > (beyond * beyond) / 2) return false;
  for (let c = 0; c < 4; c++) {
    unitA[c] = values[a + c] * ia;
    unitB[c] = values[b + c] * ib;
  }
  slerpInto(point, unitA, 0, unitB, 0, u);
  const exact =
    Math.abs(point[0] * values[q] + point[1] * values[q + 1] + point[2] * values[q + 2] + point[3] * values[q + 3]) *
    iq;
  return Math.acos(Math.min(1, exact / Math.hypot(point[0], point[1], point[2], point[3]))) <= tolerance;
}

/** Whether keys k−1..k+1 are one cubic: the merged segment reproduces key k's value and tangents. */
function isOnSameCubic(
  values: Float32Array,
  times: Float32Array,
  inTangents: Float32Array,
  outTangents: Float32Array,
  k: number,
  chordTolerance: number
): boolean {
  const before = times[k] - times[k - 1];
  const after = times[k + 1] - times[k];
  const span = before + after;
  if (!(before > 0 && after > 0)) return false;
  const from = (k - 1) * 4;
  const key = k * 4;
  const to = (k + 1) * 4;
  if (!isUsableKey(values, from) || !isUsableKey(values, key) || !isUsableKey(values, to)) return false;
  const u = before / span;
  hermiteInto(point, values, outTangents, inTangents, from, to, span, u);
  const valueGap = distance(values, key, point);
  if (!(valueGap <= chordTolerance)) return false;
  hermiteVelocityInto(velocity, values, outTangents, inTangents, from, to, span, u);
  const inGap = distance(inTangents, key, velocity);
  const outGap = distance(outTangents, key, velocity);
  const tangentGap = HERMITE_TANGENT_WEIGHT_MAX * Math.max(before * inGap, after * outGap);
  return valueGap + tangentGap <= chordTolerance;
}

/** 4D distance between the vector at `offset` in `array` and `point`. */
function distance(array: Float32Array, offset: number, point: Float64Array): number {
  const dx = array[offset] - point[0];
  const dy = array[offset + 1] - point[1];
  const dz = array[offset + 2] - point[2];
  const dw = array[offset + 3] - point[3];
  return Math.sqrt(dx * dx + dy * dy + dz * dz + dw * dw);
}

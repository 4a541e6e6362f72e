/**
 * The channel digest's pass for LINEAR and STEP channels (CUBICSPLINE has its own copy in
 * scan-cubic-keys.ts on purpose: one loop for all interpolations measured about 2.5× slower,
 * because the compiled loop carried every branch's state). STEP channels skip the segment tests:
 * they never interpolate. See channel-digest.ts for what each mark means.
 */
import type { DigestBuilder } from './digest-builder';
import type { DigestThresholds } from './digest-thresholds';
import { MARK, REDUNDANCY, REDUNDANT_MIN_RUN } from './digest-marks';

/**
 * Takes the arrays rather than the channel object on purpose: a parameter whose object shape
 * differs from the one seen while priming costs a deoptimization at entry.
 */
export function scanLinearOrStep(
  values: Float32Array,
  times: Float32Array,
  keyCount: number,
  isStep: boolean,
  thresholds: DigestThresholds,
  builder: DigestBuilder
): void {
  if (keyCount === 0) return;
  const { zeroSquared, lengthLow, lengthHigh, antipodeSquared, wideCosineSquared, speedFactor } = thresholds;
  const { redundantAngle, redundantSquared, repeatCosineSquared } = thresholds;

  // Key k−1 (x1…) and key k−2 (x2…), their squared lengths, the dot between them and the interval.
  let x1 = values[0];
  let y1 = values[1];
  let z1 = values[2];
  let w1 = values[3];
  let x2 = 0;
  let y2 = 0;
  let z2 = 0;
  let w2 = 0;
  let lengthSquared1 = x1 * x1 + y1 * y1 + z1 * z1 + w1 * w1;
  let lengthSquared2 = 0;
  let dot1 = 0;
  let duration1 = 0;
  let time1 = times[0];
  let runStart = 0;
  let runLength = 0;
  if (!(lengthSquared1 >= zeroSquared && lengthSquared1 < Infinity)) builder.mark(MARK.notARotation, 0);
  else if (lengthSquared1 > lengthHigh || lengthSquared1 < lengthLow) builder.mark(MARK.unitDrift, 0);

  for (let k = 1, o = 4; k < keyCount; k++, o += 4) {
    const time = times[k];
    const duration = time - time1;
    const x = values[o];
    const y = values[o + 1];
    const z = values[o + 2];
    const w = values[o + 3];
    const lengthSquared = x * x + y * y + z * z + w * w;
    const dot = x1 * x + y1 * y + z1 * z + w1 * w;
    const dotSquared = dot * dot;
    const lengthProduct = lengthSquared1 * lengthSquared;

    // redundant-keys for key k−1, between keys k−2 and k (never the first or last key). The cheap
    // rejection is written out here because V8 will not inline a call this size into the loop.
    if (k >= 2) {
      let redundancy: number = REDUNDANCY.no;
      const lengthSum = lengthSquared2 + lengthSquared;
      if (isStep) {
        redundancy = repeatOutcome(dot1 * dot1, lengthSquared2 * lengthSquared1, repeatCosineSquared);
      } else if (
        lengthSquared1 > 0 &&
        lengthSquared2 > 0 &&
        lengthSquared > 0 &&
        lengthSum + lengthSquared1 < Infinity
      ) {
        let dotAB = x2 * x + y2 * y + z2 * z + w2 * w;
        let along = dot1 + dot;
        // Appendix C slerp heads for whichever of ±q_k is nearer to q_k−2.
        if (dotAB < 0) {
          dotAB = -dotAB;
          along = dot1 - dot;
        }
        const differenceSquared = lengthSum - 2 * dotAB;
        const base = (lengthSum + 2 * dotAB) * lengthSquared1;
        const rejectCosine = 1 - redundantSquared - 1e-5 * differenceSquared;
        const span = duration1 + duration;
        const skew = duration1 - duration;
        const mismatch = lengthSquared2 - lengthSquared;
        const isEven =
          skew <= 2e-3 * span && -skew <= 2e-3 * span && mismatch <= 1e-4 && -mismatch <= 1e-4 && lengthSum >= 1;
        const alongSquared = along * along;
        if (!isEven) redundancy = REDUNDANCY.undecided;
        else if (alongSquared >= rejectCosine * rejectCosine * base) {
          // Out of line on purpose: inlined, this rarer part made the whole loop measure twice as slow.
          redundancy = slerpOutcome(
            alongSquared,
            base,
            differenceSquared,
            span,
            skew,
            mismatch,
            lengthSum,
            redundantAngle
          );
        }
      }
      if (redundancy !== REDUNDANCY.no) {
        if (runLength === 0) runStart = k - 1;
        runLength++;
        if (redundancy === REDUNDANCY.undecided) builder.mark(MARK.redundantKeys, k - 1);
      }
      // Close the run here, not after the loop: V8 compiles the hot loop mid-call, and code after it
      // that has never run then deoptimizes at the end of every later call.
      if ((redundancy === REDUNDANCY.no || k === keyCount - 1) && runLength > 0) {
        if (runLength >= REDUNDANT_MIN_RUN) builder.run(runStart, runStart + runLength - 1);
        runLength = 0;
      }
    }

    let mark = 0;
    // NaN fails every comparison, so `!(a > b)` style tests catch it.
    if (!(time > time1)) mark = MARK.keyTimes;
    if (!(lengthSquared >= zeroSquared && lengthSquared < Infinity)) mark |= MARK.notARotation;
    else if (lengthSquared > lengthHigh || lengthSquared < lengthLow) mark |= MARK.unitDrift;
    if (!isStep) {
      if (dot < 0) mark |= MARK.hemisphereJump;
      if (lengthSquared1 + lengthSquared + 2 * dot <= antipodeSquared) mark |= MARK.antipodalKeys;
      if (dotSquared < wideCosineSquared * lengthProduct) mark |= MARK.wideArc;
      // speed ≤ π·√(1 − |cos|)/Δt, so a segment can only pass the limit when |cos| < 1 − (limit/π)²·Δt².
      const cosineLimit = 1 - speedFactor * duration * duration;
      if (duration > 0 && cosineLimit > 0 && dotSquared < cosineLimit * cosineLimit * lengthProduct) {
        mark |= MARK.spinSpike;
      }
    }
    if (mark !== 0) builder.mark(mark, k);

    x2 = x1;
    y2 = y1;
    z2 = z1;
    w2 = w1;
    x1 = x;
    y1 = y;
    z1 = z;
    w1 = w;
    lengthSquared2 = lengthSquared1;
    lengthSquared1 = lengthSquared;
    dot1 = dot;
    duration1 = duration;
    time1 = time;
  }
}

/** STEP: does a key repeat the one before it (|cos| ≥ cos tol, squared)? Rounding-close calls stay undecided. */
function repeatOutcome(dotSquared: number, lengthProduct: number, cosineSquared: number): number {
  if (!(lengthProduct > 0 && lengthProduct < Infinity)) return REDUNDANCY.no;
  if (dotSquared >= cosineSquared * lengthProduct * (1 + 1e-12)) return REDUNDANCY.yes;
  if (dotSquared < cosineSquared * lengthProduct * (1 - 1e-12)) return REDUNDANCY.no;
  return REDUNDANCY.undecided;
}

/**
 * LINEAR redundancy, the part after the cheap rejection in the loop: is key m on the slerp (glTF
 * 2.0 Appendix C) between its neighbours a and b?
 * For evenly spaced keys of even length that slerp lands on the direction of a + b, so the pass
 * measures d = angle(m, a + b) through cos²d = (m·(a + b))² / (|a + b|²·|m|²), and bounds how far the
 * true slerp point can be from that direction by s = φ̂·(|u − ½| + 1.28·|l_a − l_b| / (2(l_a + l_b))):
 * - the slerp at u is |u − ½|·φ from the slerp at ½ (φ the 4D angle between a and b);
 * - unequal lengths tilt a + b off the midpoint like an nlerp parameter off by |l_a − l_b| / (2(l_a + l_b))
 *   at most, and the nlerp angle changes by at most 2·tan(φ/2) ≤ 1.28·φ per unit of parameter;
 * - φ ≤ φ̂ = (π/2)·|a − b| when l_a + l_b ≥ 1, from acos x ≤ (π/2)·√(1−x).
 * Then d > tol + s rules the key out and d ≤ tol − s makes it redundant (cos Y ≥ 1 − Y²/2,
 * cos X ≤ 1 − X²/2 + X⁴/24). A first, division-free rejection uses the largest s the checked
 * conditions allow (|u − ½| ≤ 10⁻³, |l_a − l_b| ≤ 10⁻⁴: s² ≤ 2.8·10⁻⁶·|a − b|², so cos d <
 * 1 − tol² − 10⁻⁵·|a − b|² is enough); the exact s is only computed for keys that survive it.
 * Keys outside the conditions, or within s of the tolerance, stay undecided for the exact test.
 */
function slerpOutcome(
  alongSquared: number,
  base: number,
  differenceSquared: number,
  span: number,
  skew: number,
  mismatch: number,
  lengthSum: number,
  tolerance: number
): number {
  const slack =
    (Math.PI / 2) *
    Math.sqrt(differenceSquared) *
    ((skew < 0 ? -skew : skew) / (2 * span) + (0.64 * (mismatch < 0 ? -mismatch : mismatch)) / lengthSum);
  const beyond = tolerance + slack;
  const farCosine = 1 - (beyond * beyond) / 2;
  // Squaring only compares cosines while both sides are positive (|cos d| is).
  if (farCosine > 0 && alongSquared < farCosine * farCosine * base) return REDUNDANCY.no;
  const margin = tolerance - slack;
  if (margin <= 0) return REDUNDANCY.undecided;
  const marginSquared = margin * margin;
  const nearCosine = 1 - marginSquared / 2 + (marginSquared * marginSquared) / 24;
  return alongSquared >= nearCosine * nearCosine * base ? REDUNDANCY.yes : REDUNDANCY.undecided;
}

/**
 * The channel digest's pass for CUBICSPLINE channels: the tests of scan-linear-keys.ts plus
 * tangent checks, the spline-dip screen and the cubic redundancy test. See channel-digest.ts.
 */
import type { DigestBuilder } from './digest-builder';
import type { DigestThresholds } from './digest-thresholds';
import { MARK, REDUNDANCY, REDUNDANT_MIN_RUN } from './digest-marks';
import { HERMITE_TANGENT_WEIGHT_MAX } from '../../math/hermite';

/** Takes arrays, not the channel object, for the reason given in scan-linear-keys.ts. */
export function scanCubic(
  values: Float32Array,
  inTangents: Float32Array,
  outTangents: Float32Array,
  times: Float32Array,
  keyCount: number,
  thresholds: DigestThresholds,
  builder: DigestBuilder
): void {
  if (keyCount === 0) return;
  const { zeroSquared, lengthLow, lengthHigh, antipodeSquared, wideCosineSquared, speedFactor } = thresholds;
  const { splineReachSquared, splineCosine, redundantChord } = thresholds;
  const splineCosineSquared = splineCosine * splineCosine;
  const chordSquared = redundantChord * redundantChord * (1 + 1e-9);

  let x1 = values[0];
  let y1 = values[1];
  let z1 = values[2];
  let w1 = values[3];
  let lengthSquared1 = x1 * x1 + y1 * y1 + z1 * z1 + w1 * w1;
  let lengthSquared2 = 0;
  let outTangentSquared1 = squaredLength(outTangents, 0);
  let duration1 = 0;
  let time1 = times[0];
  let runStart = 0;
  let runLength = 0;
  if (!(lengthSquared1 >= zeroSquared && lengthSquared1 < Infinity)) builder.mark(MARK.notARotation, 0);
  else if (lengthSquared1 > lengthHigh || lengthSquared1 < lengthLow) builder.mark(MARK.unitDrift, 0);
  const firstTangents = outTangentSquared1 + squaredLength(inTangents, 0);
  if (!(firstTangents < Infinity)) builder.mark(MARK.tangent, 0);

  for (let k = 1, o = 4; k < keyCount; k++, o += 4) {
    const time = times[k];
    const duration = time - time1;
    const x = values[o];
    const y = values[o + 1];
    const z = values[o + 2];
    const w = values[o + 3];
    const lengthSquared = x * x + y * y + z * z + w * w;
    const inTangentSquared = squaredLength(inTangents, o);
    const outTangentSquared = squaredLength(outTangents, o);
    const dot = x1 * x + y1 * y + z1 * z + w1 * w;
    const dotSquared = dot * dot;
    const lengthProduct = lengthSquared1 * lengthSquared;

    // redundant-keys for key k−1, between keys k−2 and k (never the first or last key).
    if (k >= 2) {
      let redundancy: number = REDUNDANCY.no;
      if (
        duration > 0 &&
        duration1 > 0 &&
        lengthSquared > 0 &&
        lengthSquared1 > 0 &&
        lengthSquared2 > 0 &&
        lengthSquared + lengthSquared1 + lengthSquared2 < Infinity
      ) {
        // |p(u) − v_k−1|² for the single cubic (glTF 2.0 Appendix C) through keys k−2 and k, their
        // values and outer tangents: a key this curve misses cannot be redundant, which settles
        // almost every key of a moving channel. Written out: V8 will not inline it into the loop.
        const span = duration1 + duration;
        const u = duration1 / span;
        const u2 = u * u;
        const u3 = u2 * u;
        const h00 = 2 * u3 - 3 * u2 + 1;
        const h01 = 1 - h00;
        const h10 = span * (u3 - 2 * u2 + u);
        const h11 = span * (u3 - u2);
        const a = o - 8;
        const dx = h00 * values[a] + h01 * x + h10 * outTangents[a] + h11 * inTangents[o] - x1;
        const dy = h00 * values[a + 1] + h01 * y + h10 * outTangents[a + 1] + h11 * inTangents[o + 1] - y1;
        const dz = h00 * values[a + 2] + h01 * z + h10 * outTangents[a + 2] + h11 * inTangents[o + 2] - z1;
        const dw = h00 * values[a + 3] + h01 * w + h10 * outTangents[a + 3] + h11 * inTangents[o + 3] - w1;
        if (dx * dx + dy * dy + dz * dz + dw * dw <= chordSquared) {
          // Key k−1's in-tangent must match the merged cubic's velocity there; most keys fail here.
          const d00 = (6 * u2 - 6 * u) / span;
          const d10 = 3 * u2 - 4 * u + 1;
          const d11 = 3 * u2 - 2 * u;
          const m = o - 4;
          const ix = inTangents[m] - (d00 * (values[a] - x) + d10 * outTangents[a] + d11 * inTangents[o]);
          const iy =
            inTangents[m + 1] - (d00 * (values[a + 1] - y) + d10 * outTangents[a + 1] + d11 * inTangents[o + 1]);
          const iz =
            inTangents[m + 2] - (d00 * (values[a + 2] - z) + d10 * outTangents[a + 2] + d11 * inTangents[o + 2]);
          const iw =
            inTangents[m + 3] - (d00 * (values[a + 3] - w) + d10 * outTangents[a + 3] + d11 * inTangents[o + 3]);
          const reach = HERMITE_TANGENT_WEIGHT_MAX * duration1;
          if ((ix * ix + iy * iy + iz * iz + iw * iw) * reach * reach <= chordSquared) {
            redundancy = tangentOutcome(values, inTangents, outTangents, o, duration1, duration, redundantChord);
          }
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
    if (!(time > time1)) mark = MARK.keyTimes;
    if (!(lengthSquared >= zeroSquared && lengthSquared < Infinity)) mark |= MARK.notARotation;
    else if (lengthSquared > lengthHigh || lengthSquared < lengthLow) mark |= MARK.unitDrift;
    if (!(inTangentSquared + outTangentSquared < Infinity)) mark |= MARK.tangent;
    if (dot < 0) mark |= MARK.hemisphereJump;
    if (lengthSquared1 + lengthSquared + 2 * dot <= antipodeSquared) mark |= MARK.antipodalKeys;
    if (dotSquared < wideCosineSquared * lengthProduct) mark |= MARK.wideArc;
    const cosineLimit = 1 - speedFactor * duration * duration;
    if (duration > 0 && cosineLimit > 0 && dotSquared < cosineLimit * cosineLimit * lengthProduct) {
      mark |= MARK.spinSpike;
    }
    // spline-dip is ruled out when the tangents pull in by at most the reach and the chord keeps its cosine.
    const isTangentShort = duration * duration * (outTangentSquared1 + inTangentSquared) <= splineReachSquared;
    const isChordLong =
      lengthSquared >= lengthLow &&
      lengthSquared1 >= lengthLow &&
      (splineCosine <= 0 ? dot >= 0 : dot > 0 && dotSquared >= splineCosineSquared * lengthProduct);
    if (!(isTangentShort && isChordLong)) mark |= MARK.splineDip;
    if (mark !== 0) builder.mark(mark, k);

    x1 = x;
    y1 = y;
    z1 = z;
    w1 = w;
    lengthSquared2 = lengthSquared1;
    lengthSquared1 = lengthSquared;
    outTangentSquared1 = outTangentSquared;
    duration1 = duration;
    time1 = time;
  }
}

function squaredLength(array: Float32Array, offset: number): number {
  const x = array[offset];
  const y = array[offset + 1];
  const z = array[offset + 2];
  const w = array[offset + 3];
  return x * x + y * y + z * z + w * w;
}

/**
 * For a key the merged cubic already passes through: do its tangents match the merged cubic's
 * velocity, so both original segments are that cubic? The two pieces differ from it by at most
 * |Δv| + (4/27)·t_d·|Δtangent| (|h01| ≤ 1, |h11| ≤ 4/27), which must stay within the 4D chord of the
 * tolerance. Rounding-close calls stay undecided for the rule's exact test.
 */
function tangentOutcome(
  values: Float32Array,
  inTangents: Float32Array,
  outTangents: Float32Array,
  o: number,
  durationBefore: number,
  durationAfter: number,
  chord: number
): number {
  const span = durationBefore + durationAfter;
  const u = durationBefore / span;
  const u2 = u * u;
  const d00 = (6 * u2 - 6 * u) / span;
  const d10 = 3 * u2 - 4 * u + 1;
  const d11 = 3 * u2 - 2 * u;
  const a = o - 8;
  const m = o - 4;
  let inGap = 0;
  let outGap = 0;
  let valueGap = 0;
  const h00 = 2 * u2 * u - 3 * u2 + 1;
  const h10 = span * (u2 * u - 2 * u2 + u);
  const h11 = span * (u2 * u - u2);
  for (let c = 0; c < 4; c++) {
    const velocity = d00 * (values[a + c] - values[o + c]) + d10 * outTangents[a + c] + d11 * inTangents[o + c];
    const point = h00 * values[a + c] + (1 - h00) * values[o + c] + h10 * outTangents[a + c] + h11 * inTangents[o + c];
    inGap += (inTangents[m + c] - velocity) ** 2;
    outGap += (outTangents[m + c] - velocity) ** 2;
    valueGap += (values[m + c] - point) ** 2;
  }
  const total =
    Math.sqrt(valueGap) +
    HERMITE_TANGENT_WEIGHT_MAX * Math.max(durationBefore * Math.sqrt(inGap), durationAfter * Math.sqrt(outGap));
  if (total <= chord * (1 - 1e-9)) return REDUNDANCY.yes;
  if (total > chord * (1 + 1e-9)) return REDUNDANCY.no;
  return REDUNDANCY.undecided;
}

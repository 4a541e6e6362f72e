/**
 * The digest must never hide a key a rule would report: every exact mark equals the rule's own
 * test, and every candidate mark covers it. These properties compare the marks with brute-force
 * versions of each test on random channels full of defects.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parsePolicy } from '../../policy';
import type { Interpolation, RotationChannel } from '../../read/rotation-channel';
import { MARK, forEachMarkedKey, getChannelDigest } from './channel-digest';
import { axisAngle, channelFrom } from '../testing';

const policy = parsePolicy({});

const defect = fc.constantFrom(
  'none',
  'none',
  'none',
  'flip',
  'drift',
  'zero',
  'nan',
  'jump',
  'repeat-time',
  'big-tangent'
);

const channelArbitrary = fc
  .record({
    interpolation: fc.constantFrom<Interpolation>('LINEAR', 'STEP', 'CUBICSPLINE'),
    axis: fc.tuple(
      fc.double({ min: -1, max: 1, noNaN: true }),
      fc.double({ min: 0.1, max: 1, noNaN: true }),
      fc.double({ min: -1, max: 1, noNaN: true })
    ),
    steps: fc.array(fc.double({ min: -8, max: 8, noNaN: true }), { minLength: 2, maxLength: 40 }),
    defects: fc.array(defect, { minLength: 40, maxLength: 40 })
  })
  .map(({ interpolation, axis, steps, defects }) => {
    let angle = 0;
    const quats: number[][] = [];
    const times: number[] = [];
    const tangents: number[][] = [];
    steps.forEach((step, k) => {
      angle += step;
      let q: number[] = axisAngle(axis, angle);
      if (defects[k] === 'flip') q = q.map((c) => -c);
      if (defects[k] === 'drift') q = q.map((c) => c * 1.004);
      if (defects[k] === 'zero') q = [0, 0, 0, 0];
      if (defects[k] === 'nan') q = [NaN, 0, 0, 1];
      if (defects[k] === 'jump') q = axisAngle([1, 0, 0], 170);
      quats.push(q);
      times.push(defects[k] === 'repeat-time' && k > 0 ? times[k - 1] : k / 30);
      tangents.push(defects[k] === 'big-tangent' ? [5, -5, 5, 0] : q.map((c) => c * 0.1));
    });
    return channelFrom({ interpolation, quats, times, inTangents: tangents, outTangents: tangents });
  });

function marked(channel: RotationChannel, mark: number): number[] {
  const keys: number[] = [];
  forEachMarkedKey(getChannelDigest(channel, policy), mark, (k) => keys.push(k));
  return keys;
}

function lengthSquared(values: Float32Array, k: number): number {
  return values[4 * k] ** 2 + values[4 * k + 1] ** 2 + values[4 * k + 2] ** 2 + values[4 * k + 3] ** 2;
}

function dot(values: Float32Array, a: number, b: number): number {
  let sum = 0;
  for (let c = 0; c < 4; c++) sum += values[4 * a + c] * values[4 * b + c];
  return sum;
}

function isUsable(values: Float32Array, k: number): boolean {
  const l = lengthSquared(values, k);
  return l > 0 && l < Infinity;
}

function range(count: number): number[] {
  return Array.from({ length: count }, (_, k) => k);
}

describe('channel digest marks', () => {
  it('marks exactly the keys that are no rotation, and covers every drifted key', () => {
    fc.assert(
      fc.property(channelArbitrary, (channel) => {
        const { values, keyCount } = channel;
        const notRotation = range(keyCount).filter(
          (k) => !(lengthSquared(values, k) >= 1e-12 && lengthSquared(values, k) < Infinity)
        );
        expect(marked(channel, MARK.notARotation)).toEqual(notRotation);
        const drifted = range(keyCount).filter(
          (k) => !notRotation.includes(k) && Math.abs(Math.sqrt(lengthSquared(values, k)) - 1) > 1e-3
        );
        expect(marked(channel, MARK.unitDrift)).toEqual(expect.arrayContaining(drifted));
      })
    );
  });

  it('marks exactly the negative-dot steps, and covers every wide arc and every step over the speed limit', () => {
    fc.assert(
      fc.property(channelArbitrary, (channel) => {
        const { values, times, keyCount } = channel;
        const isStep = channel.interpolation === 'STEP';
        const steps = range(keyCount).slice(1);
        const negative = isStep ? [] : steps.filter((k) => dot(values, k - 1, k) < 0);
        expect(marked(channel, MARK.hemisphereJump)).toEqual(negative);
        const angleOf = (k: number) =>
          2 *
          Math.acos(
            Math.min(
              1,
              Math.abs(dot(values, k - 1, k)) / Math.sqrt(lengthSquared(values, k - 1) * lengthSquared(values, k))
            )
          );
        const usableSteps = isStep ? [] : steps.filter((k) => isUsable(values, k - 1) && isUsable(values, k));
        const wide = usableSteps.filter((k) => (angleOf(k) * 180) / Math.PI > 150);
        expect(marked(channel, MARK.wideArc)).toEqual(expect.arrayContaining(wide));
        const fast = usableSteps.filter(
          (k) => times[k] > times[k - 1] && ((angleOf(k) / (times[k] - times[k - 1])) * 180) / Math.PI > 1440
        );
        expect(marked(channel, MARK.spinSpike)).toEqual(expect.arrayContaining(fast));
      })
    );
  });

  it('covers every CUBICSPLINE step whose curve sags below splineMinLength (glTF 2.0 Appendix C)', () => {
    fc.assert(
      fc.property(channelArbitrary, (channel) => {
        if (channel.interpolation !== 'CUBICSPLINE') return;
        const { values, times, keyCount } = channel;
        const outTangents = channel.outTangents!;
        const inTangents = channel.inTangents!;
        const sagging = range(keyCount)
          .slice(1)
          .filter((k) => {
            const td = times[k] - times[k - 1];
            if (!(td > 0) || !isUsable(values, k - 1) || !isUsable(values, k)) return false;
            for (let t = 0; t <= 1; t += 1 / 64) {
              let sum = 0;
              for (let c = 0; c < 4; c++) {
                const p =
                  (2 * t ** 3 - 3 * t ** 2 + 1) * values[4 * (k - 1) + c] +
                  td * (t ** 3 - 2 * t ** 2 + t) * outTangents[4 * (k - 1) + c] +
                  (-2 * t ** 3 + 3 * t ** 2) * values[4 * k + c] +
                  td * (t ** 3 - t ** 2) * inTangents[4 * k + c];
                sum += p * p;
              }
              if (Math.sqrt(sum) < 0.9) return true;
            }
            return false;
          });
        expect(marked(channel, MARK.splineDip)).toEqual(expect.arrayContaining(sagging));
      })
    );
  });

  it('flags key times exactly when they are not finite, non-negative and strictly increasing', () => {
    fc.assert(
      fc.property(channelArbitrary, (channel) => {
        const times = Array.from(channel.times);
        const isBroken = times.some(
          (time, k) => !Number.isFinite(time) || time < 0 || (k > 0 && !(time > times[k - 1]))
        );
        expect((getChannelDigest(channel, policy).flags & MARK.keyTimes) !== 0).toBe(isBroken);
      })
    );
  });

  it('is cached per channel and policy, and recomputed for another policy', () => {
    const channel = channelFrom({
      interpolation: 'LINEAR',
      quats: [axisAngle([0, 1, 0], 0), axisAngle([0, 1, 0], 160)]
    });
    const first = getChannelDigest(channel, policy);
    expect(getChannelDigest(channel, policy)).toBe(first);
    const wider = parsePolicy({ wideArcDegrees: 170 });
    expect(getChannelDigest(channel, wider).flags & MARK.wideArc).toBe(0);
    expect(first.flags & MARK.wideArc).toBe(MARK.wideArc);
  });
});

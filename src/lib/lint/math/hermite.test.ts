import { describe, expect, it } from 'vitest';
import { HERMITE_TANGENT_WEIGHT_MAX, hermiteInto, hermiteVelocityInto } from './hermite';

// Appendix C of glTF 2.0, written out independently per component for the oracle:
// p(t) = (2t³−3t²+1)v_k + t_d(t³−2t²+t)b_k + (−2t³+3t²)v_k+1 + t_d(t³−t²)a_k+1
function appendixC(v0: number, b0: number, v1: number, a1: number, td: number, t: number): number {
  return (
    (2 * t ** 3 - 3 * t ** 2 + 1) * v0 +
    td * (t ** 3 - 2 * t ** 2 + t) * b0 +
    (-2 * t ** 3 + 3 * t ** 2) * v1 +
    td * (t ** 3 - t ** 2) * a1
  );
}

const values = [0.1, 0.2, 0.3, 0.9, -0.2, 0.4, 0.1, 0.8];
const outTangents = [0.5, -1, 2, 0.25, 0, 0, 0, 0];
const inTangents = [0, 0, 0, 0, 1.5, 0.5, -0.75, 0.1];

describe('hermiteInto', () => {
  it('evaluates the glTF 2.0 Appendix C cubic spline formula', () => {
    for (const t of [0, 0.1, 0.37, 0.5, 0.9, 1]) {
      const out = hermiteInto(new Float64Array(4), values, outTangents, inTangents, 0, 4, 0.4, t);
      for (let c = 0; c < 4; c++) {
        expect(out[c]).toBeCloseTo(appendixC(values[c], outTangents[c], values[4 + c], inTangents[4 + c], 0.4, t), 12);
      }
    }
  });

  it('passes through the keys at t = 0 and t = 1', () => {
    const start = hermiteInto(new Float64Array(4), values, outTangents, inTangents, 0, 4, 0.4, 0);
    const end = hermiteInto(new Float64Array(4), values, outTangents, inTangents, 0, 4, 0.4, 1);
    for (let c = 0; c < 4; c++) {
      expect(start[c]).toBeCloseTo(values[c], 12);
      expect(end[c]).toBeCloseTo(values[4 + c], 12);
    }
  });
});

describe('hermiteVelocityInto', () => {
  it('is the time derivative of the Appendix C curve (central differences)', () => {
    const duration = 0.4;
    for (const t of [0.05, 0.3, 0.5, 0.8]) {
      const velocity = hermiteVelocityInto(new Float64Array(4), values, outTangents, inTangents, 0, 4, duration, t);
      const h = 1e-6;
      for (let c = 0; c < 4; c++) {
        const ahead = appendixC(values[c], outTangents[c], values[4 + c], inTangents[4 + c], duration, t + h);
        const behind = appendixC(values[c], outTangents[c], values[4 + c], inTangents[4 + c], duration, t - h);
        // d/dt_seconds = (d/dt) / t_d.
        expect(velocity[c]).toBeCloseTo((ahead - behind) / (2 * h) / duration, 5);
      }
    }
  });

  it('equals the out-tangent at the segment start and the in-tangent at its end (Appendix C)', () => {
    const start = hermiteVelocityInto(new Float64Array(4), values, outTangents, inTangents, 0, 4, 0.4, 0);
    const end = hermiteVelocityInto(new Float64Array(4), values, outTangents, inTangents, 0, 4, 0.4, 1);
    for (let c = 0; c < 4; c++) {
      expect(start[c]).toBeCloseTo(outTangents[c], 12);
      expect(end[c]).toBeCloseTo(inTangents[4 + c], 12);
    }
  });
});

describe('HERMITE_TANGENT_WEIGHT_MAX', () => {
  it('bounds |t³ − 2t² + t| and |t³ − t²| on [0, 1], with equality at t = 1/3 and 2/3', () => {
    let largest = 0;
    for (let i = 0; i <= 10_000; i++) {
      const t = i / 10_000;
      largest = Math.max(largest, Math.abs(t ** 3 - 2 * t ** 2 + t), Math.abs(t ** 3 - t ** 2));
    }
    expect(largest).toBeLessThanOrEqual(HERMITE_TANGENT_WEIGHT_MAX + 1e-15);
    expect(largest).toBeCloseTo(4 / 27, 7);
  });
});

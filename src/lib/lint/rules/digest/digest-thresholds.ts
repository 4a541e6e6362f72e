/**
 * The policy's tolerances turned into the squared thresholds one pass over a channel's keys
 * compares against, so the hot loops need no square root or division (see channel-digest.ts).
 */
import type { Policy } from '../../policy';
import type { RotationChannel } from '../../read/rotation-channel';
import { HERMITE_TANGENT_WEIGHT_MAX } from '../../math/hermite';

/**
 * Relative slack on thresholds: the rules' own arithmetic rounds differently (other operation
 * order, square roots), and a mark must never be missing where a rule would report.
 */
export const SLACK = 1e-9;

/** Thresholds for one channel under one policy. */
export interface DigestThresholds {
  zeroSquared: number;
  /** (1 ± unit-drift warning tolerance)², the tolerance at least two encoding steps. */
  lengthLow: number;
  lengthHigh: number;
  antipodeSquared: number;
  /** cos²(wideArcDegrees / 2). */
  wideCosineSquared: number;
  /** (maxSpeed / π)² in 1/s²: a segment may pass the limit only when 1 − |cos| > this · Δt². */
  speedFactor: number;
  /** spline-dip: Δt²(|b|² + |a|²) at most this keeps the tangents' pull within the reach. */
  splineReachSquared: number;
  /** spline-dip: the chord must keep |cos| at least this (≤ 0: a non-negative dot suffices). */
  splineCosine: number;
  /** redundant-keys: 4D angle tolerance, its square, cos² of it (STEP), and 4·sin²(tol/2) (CUBICSPLINE chord²). */
  redundantAngle: number;
  redundantSquared: number;
  repeatCosineSquared: number;
  redundantChord: number;
}

export function thresholdsFor(channel: RotationChannel, policy: Policy): DigestThresholds {
  const { tolerances } = policy;
  // Rounding each component to its encoding step already moves the length by up to one step.
  const drift = Math.max(tolerances.unitWarning, 2 * channel.quantizationStep);
  const lengthLow = drift < 1 ? (1 - drift) ** 2 * (1 - SLACK) : 0;
  const maxSpeed = (policy.maxSpeedDegreesPerSecond * Math.PI) / 180;
  // spline-dip (see spline-dip.ts): tangents may pull in by r = (1 − L)/2, the chord must stay L + r out.
  const minLength = policy.splineMinLength;
  const reach = (1 - minLength) / 2;
  // |chord|² ≥ min(|v|²)·(1 + cos)/2 ≥ lengthLow·(1 + cos)/2 must reach (L + r)².
  const splineCosine = lengthLow > 0 ? (2 * (minLength + reach) ** 2) / lengthLow - 1 : 2;
  // The 4D angle between quaternions is half the rotation angle between the poses.
  const redundantAngle = (tolerances.redundantDegrees * Math.PI) / 360;
  return {
    zeroSquared: tolerances.zeroLength ** 2,
    lengthLow,
    lengthHigh: (1 + drift) ** 2 * (1 + SLACK),
    antipodeSquared: tolerances.antipodal ** 2 * (1 + SLACK),
    wideCosineSquared: Math.cos((policy.wideArcDegrees * Math.PI) / 360) ** 2 * (1 + SLACK),
    speedFactor: (maxSpeed / Math.PI) ** 2 * (1 - SLACK),
    splineReachSquared: (reach / HERMITE_TANGENT_WEIGHT_MAX) ** 2 / 2,
    splineCosine: splineCosine > 0 ? splineCosine * (1 + SLACK) : splineCosine,
    redundantAngle,
    redundantSquared: redundantAngle ** 2,
    repeatCosineSquared: Math.cos(redundantAngle) ** 2,
    redundantChord: 2 * Math.sin(redundantAngle / 2)
  };
}

/**
 * Smooth procedural rotation: a few angle curves, one per axis, composed into a quaternion.
 * The generators describe every joint's motion this way so keys come out unit and continuous
 * (each factor's half-angle sine and cosine change smoothly, so there is no sign flip to
 * canonicalise away).
 */
import { AXES, fromAxisAngle, multiply, normalize, type Quat } from './quaternion';

/** One angle over time about one axis: offset + amplitude·sin(2π(f·t + phase)) + full turns. */
export interface AngleCurve {
  axis: 'x' | 'y' | 'z';
  offsetDegrees?: number;
  amplitudeDegrees?: number;
  frequencyHz?: number;
  /** Phase as a fraction of a cycle (0.25 = a quarter cycle ahead). */
  phaseTurns?: number;
  /** Steady spin added on top, in whole turns per second (negative spins the other way). */
  turnsPerSecond?: number;
}

/** The angle of one curve in degrees at `timeSeconds`. */
export function angleDegreesAt(curve: AngleCurve, timeSeconds: number): number {
  const wave =
    (curve.amplitudeDegrees ?? 0) *
    Math.sin(2 * Math.PI * ((curve.frequencyHz ?? 0) * timeSeconds + (curve.phaseTurns ?? 0)));
  return (curve.offsetDegrees ?? 0) + wave + 360 * (curve.turnsPerSecond ?? 0) * timeSeconds;
}

/**
 * The rotation the curves describe at `timeSeconds`: q = R(c0)·R(c1)·…, so the first curve is
 * the outermost (parent-most) axis, like an Euler order read left to right.
 */
export function sampleRotation(curves: readonly AngleCurve[], timeSeconds: number): Quat {
  let q: Quat = [0, 0, 0, 1];
  for (const curve of curves) {
    const radians = (angleDegreesAt(curve, timeSeconds) * Math.PI) / 180;
    q = multiply(q, fromAxisAngle(AXES[curve.axis], radians));
  }
  // Products of unit quaternions drift by rounding only; normalising keeps keys within 1e-7 of unit.
  return normalize(q);
}

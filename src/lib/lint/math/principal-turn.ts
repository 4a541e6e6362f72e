/**
 * Quarter and half turns about the principal axes: the rotations a basis conversion leaves
 * behind (−90° about X turns a Z-up asset Y-up; 180° about Y turns a −Z-facing asset to face +Z,
 * glTF 2.0 §3.4). baked-basis and clip-basis-offset look for them.
 */

/** One quarter or half turn about X, Y or Z (right-handed: positive turns are counterclockwise, §3.4). */
export interface PrincipalTurn {
  axis: 'X' | 'Y' | 'Z';
  /** −90, 90 or 180. */
  angleDegrees: number;
  /** The turn as a unit quaternion (x, y, z, w). */
  quaternion: readonly [number, number, number, number];
}

/** A principal turn matched against a rotation, with how far (rotation angle) the rotation is from it. */
export interface PrincipalTurnMatch {
  turn: PrincipalTurn;
  deviationDegrees: number;
}

const H = Math.SQRT1_2;

/** The nine non-identity principal turns. */
export const PRINCIPAL_TURNS: readonly PrincipalTurn[] = [
  { axis: 'X', angleDegrees: 90, quaternion: [H, 0, 0, H] },
  { axis: 'X', angleDegrees: -90, quaternion: [-H, 0, 0, H] },
  { axis: 'X', angleDegrees: 180, quaternion: [1, 0, 0, 0] },
  { axis: 'Y', angleDegrees: 90, quaternion: [0, H, 0, H] },
  { axis: 'Y', angleDegrees: -90, quaternion: [0, -H, 0, H] },
  { axis: 'Y', angleDegrees: 180, quaternion: [0, 1, 0, 0] },
  { axis: 'Z', angleDegrees: 90, quaternion: [0, 0, H, H] },
  { axis: 'Z', angleDegrees: -90, quaternion: [0, 0, -H, H] },
  { axis: 'Z', angleDegrees: 180, quaternion: [0, 0, 1, 0] }
];

/**
 * The principal turn nearest to the rotation (x, y, z, w), or null when none lies within
 * `toleranceDegrees` (rotation angle), or the quaternion has zero length or is not finite.
 */
export function findPrincipalTurn(
  x: number,
  y: number,
  z: number,
  w: number,
  toleranceDegrees: number
): PrincipalTurnMatch | null {
  const length = Math.sqrt(x * x + y * y + z * z + w * w);
  if (!(length > 0) || length === Infinity) return null;
  let best: PrincipalTurn | null = null;
  let bestCosine = -1;
  for (const turn of PRINCIPAL_TURNS) {
    const [tx, ty, tz, tw] = turn.quaternion;
    const cosine = Math.abs(x * tx + y * ty + z * tz + w * tw) / length;
    if (cosine > bestCosine) {
      bestCosine = cosine;
      best = turn;
    }
  }
  if (best === null) return null;
  // q and −q are the same rotation, hence |cos|; the rotation angle is twice the 4D angle.
  const deviationDegrees = (2 * Math.acos(Math.min(1, bestCosine)) * 180) / Math.PI;
  return deviationDegrees <= toleranceDegrees ? { turn: best, deviationDegrees } : null;
}

/**
 * A quarter or half turn about a principal axis in the forms removeBakedBasis needs: the exact
 * quaternion and its inverse for rotations, and the signed permutation matrix for vectors and scales.
 * A principal turn's matrix has entries −1, 0 and 1 only, so applying it to a translation or a scale
 * just moves and negates components: no rounding, which keeps world matrices identical after a fold.
 */
import type { PrincipalTurn } from '../math/principal-turn';
import { multiplyQuat } from '../math/quat-multiply';

export type Quat = [number, number, number, number];
export type Vec3 = [number, number, number];

export interface BasisTurn {
  turn: PrincipalTurn;
  quaternion: Quat;
  inverse: Quat;
  /** Row-major 3×3 signed permutation: `matrix[row][column]`. */
  matrix: readonly (readonly [number, number, number])[];
}

/** The forms of a principal turn, with its rotation matrix rounded to the exact −1/0/1 entries. */
export function toBasisTurn(turn: PrincipalTurn): BasisTurn {
  const [x, y, z, w] = turn.quaternion;
  // Rotation matrix of a unit quaternion (Shoemake), rounded: every entry of a principal turn is −1, 0 or 1.
  const exact = (value: number) => Math.round(value) + 0;
  const matrix = [
    [exact(1 - 2 * (y * y + z * z)), exact(2 * (x * y - z * w)), exact(2 * (x * z + y * w))],
    [exact(2 * (x * y + z * w)), exact(1 - 2 * (x * x + z * z)), exact(2 * (y * z - x * w))],
    [exact(2 * (x * z - y * w)), exact(2 * (y * z + x * w)), exact(1 - 2 * (x * x + y * y))]
  ] as const;
  return { turn, quaternion: [x, y, z, w], inverse: [-x, -y, -z, w], matrix };
}

/** M·v. */
export function rotateVector(basis: BasisTurn, v: ArrayLike<number>): Vec3 {
  const m = basis.matrix;
  return [
    m[0][0] * v[0] + m[0][1] * v[1] + m[0][2] * v[2] + 0,
    m[1][0] * v[0] + m[1][1] * v[1] + m[1][2] * v[2] + 0,
    m[2][0] * v[0] + m[2][1] * v[1] + m[2][2] * v[2] + 0
  ];
}

/**
 * The diagonal of M·diag(s)·Mᵀ: the same scale expressed after the turn. For a signed permutation
 * M that product is diagonal again (its entries are s_j·M_ij², so signs drop out), which is why a
 * non-uniform scale survives moving a principal turn from above the scale to below it.
 */
export function permuteScale(basis: BasisTurn, s: ArrayLike<number>): Vec3 {
  const m = basis.matrix;
  const pick = (row: 0 | 1 | 2) => (m[row][0] !== 0 ? s[0] : m[row][1] !== 0 ? s[1] : s[2]);
  return [pick(0), pick(1), pick(2)];
}

/** a·b (Hamilton product): b's rotation, then a's. */
export function multiply(a: ArrayLike<number>, b: ArrayLike<number>): Quat {
  const out = multiplyQuat(new Float64Array(4), a[0], a[1], a[2], a[3], b[0], b[1], b[2], b[3]);
  return [out[0], out[1], out[2], out[3]];
}

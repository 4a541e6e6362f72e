/**
 * Euler angles of a rotation quaternion, for each of the six orders an engine may store.
 * Orders are named as three.js names them: `XYZ` means the matrix R = Rx·Ry·Rz (intrinsic X, then Y,
 * then Z), and the middle letter's angle is the one that reaches ±90° at gimbal lock. The results
 * match three.js `Euler.setFromQuaternion`, which the tests use as the oracle, including its
 * choice at lock (the last angle is set to 0 when |sin(middle)| ≥ 0.9999999).
 */
import type { EulerOrder } from '../policy';

/** Euler angles in radians, named by axis (not by position in the order). */
export interface EulerAngles {
  x: number;
  y: number;
  z: number;
}

/** Rotation matrix elements of the normalized quaternion, row-column named (m12 = row 1, column 2). */
interface RotationElements {
  m11: number;
  m12: number;
  m13: number;
  m21: number;
  m22: number;
  m23: number;
  m31: number;
  m32: number;
  m33: number;
}

const LOCKED = 0.9999999;

/**
 * The sine of the middle angle for `order`, computed from four products without building the
 * matrix; |result| ≥ cos(margin) means the middle angle lies within `margin` of ±90°.
 * Works on un-normalized quaternions by dividing by the squared length (returns NaN for zero).
 */
export function middleAngleSine(x: number, y: number, z: number, w: number, order: EulerOrder): number {
  const lengthSquared = x * x + y * y + z * z + w * w;
  let twice: number;
  switch (order) {
    case 'XYZ':
      twice = x * z + w * y; // m13
      break;
    case 'YXZ':
      twice = w * x - y * z; // −m23
      break;
    case 'ZXY':
      twice = y * z + w * x; // m32
      break;
    case 'ZYX':
      twice = w * y - x * z; // −m31
      break;
    case 'YZX':
      twice = x * y + w * z; // m21
      break;
    case 'XZY':
      twice = w * z - x * y; // −m12
      break;
  }
  return (2 * twice) / lengthSquared;
}

/** Decomposes (x, y, z, w) into Euler angles for `order`; the quaternion is normalized first. */
export function eulerFromQuaternion(x: number, y: number, z: number, w: number, order: EulerOrder): EulerAngles {
  const m = rotationElements(x, y, z, w);
  switch (order) {
    case 'XYZ': {
      const isFree = Math.abs(m.m13) < LOCKED;
      return {
        y: Math.asin(clampUnit(m.m13)),
        x: isFree ? Math.atan2(-m.m23, m.m33) : Math.atan2(m.m32, m.m22),
        z: isFree ? Math.atan2(-m.m12, m.m11) : 0
      };
    }
    case 'YXZ': {
      const isFree = Math.abs(m.m23) < LOCKED;
      return {
        x: Math.asin(-clampUnit(m.m23)),
        y: isFree ? Math.atan2(m.m13, m.m33) : Math.atan2(-m.m31, m.m11),
        z: isFree ? Math.atan2(m.m21, m.m22) : 0
      };
    }
    case 'ZXY': {
      const isFree = Math.abs(m.m32) < LOCKED;
      return {
        x: Math.asin(clampUnit(m.m32)),
        y: isFree ? Math.atan2(-m.m31, m.m33) : 0,
        z: isFree ? Math.atan2(-m.m12, m.m22) : Math.atan2(m.m21, m.m11)
      };
    }
    case 'ZYX': {
      const isFree = Math.abs(m.m31) < LOCKED;
      return {
        y: Math.asin(-clampUnit(m.m31)),
        x: isFree ? Math.atan2(m.m32, m.m33) : 0,
        z: isFree ? Math.atan2(m.m21, m.m11) : Math.atan2(-m.m12, m.m22)
      };
    }
    case 'YZX': {
      const isFree = Math.abs(m.m21) < LOCKED;
      return {
        z: Math.asin(clampUnit(m.m21)),
        x: isFree ? Math.atan2(-m.m23, m.m22) : 0,
        y: isFree ? Math.atan2(-m.m31, m.m11) : Math.atan2(m.m13, m.m33)
      };
    }
    case 'XZY': {
      const isFree = Math.abs(m.m12) < LOCKED;
      return {
        z: Math.asin(-clampUnit(m.m12)),
        x: isFree ? Math.atan2(m.m32, m.m22) : Math.atan2(-m.m23, m.m33),
        y: isFree ? Math.atan2(m.m13, m.m11) : 0
      };
    }
  }
}

/** The axis whose angle sits in the middle of `order` (the one that locks at ±90°). */
export function middleAxisOf(order: EulerOrder): 'x' | 'y' | 'z' {
  return order[1].toLowerCase() as 'x' | 'y' | 'z';
}

function rotationElements(x: number, y: number, z: number, w: number): RotationElements {
  const length = Math.sqrt(x * x + y * y + z * z + w * w);
  x /= length;
  y /= length;
  z /= length;
  w /= length;
  return {
    m11: 1 - 2 * (y * y + z * z),
    m12: 2 * (x * y - w * z),
    m13: 2 * (x * z + w * y),
    m21: 2 * (x * y + w * z),
    m22: 1 - 2 * (x * x + z * z),
    m23: 2 * (y * z - w * x),
    m31: 2 * (x * z - w * y),
    m32: 2 * (y * z + w * x),
    m33: 1 - 2 * (x * x + y * y)
  };
}

function clampUnit(value: number): number {
  return value < -1 ? -1 : value > 1 ? 1 : value;
}

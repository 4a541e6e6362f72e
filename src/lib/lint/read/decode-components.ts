/**
 * Converts accessor components to floats, decoding normalized integers exactly as the glTF 2.0
 * §3.11 table gives them (glTF 2.0 §3.11 Animations, "normalized integer" decoding):
 *
 * | componentType         | float from integer c   |
 * | --------------------- | ---------------------- |
 * | BYTE (5120)           | max(c / 127, -1)       |
 * | UNSIGNED_BYTE (5121)  | c / 255                |
 * | SHORT (5122)          | max(c / 32767, -1)     |
 * | UNSIGNED_SHORT (5123) | c / 65535              |
 *
 * The division is done in double precision and rounded once to float32, so every code maps to
 * the float32 nearest its exact quotient. UNSIGNED_INT normalized is outside the table (and the
 * spec); it is decoded the same way, as c / 4294967295, so rotation-encoding can still report it.
 */
import type { TypedArray } from '@gltf-transform/core';

/** glTF componentType enums (glTF 2.0 §3.6.2, "Accessors"). */
export const ComponentType = {
  BYTE: 5120,
  UNSIGNED_BYTE: 5121,
  SHORT: 5122,
  UNSIGNED_SHORT: 5123,
  UNSIGNED_INT: 5125,
  FLOAT: 5126,
  FLOAT64: 5130,
  FLOAT16: 5131
} as const;

/** Largest code of each integer componentType: the divisor of its normalization. */
const NORMALIZATION_DIVISOR: Readonly<Record<number, number>> = {
  [ComponentType.BYTE]: 127,
  [ComponentType.UNSIGNED_BYTE]: 255,
  [ComponentType.SHORT]: 32767,
  [ComponentType.UNSIGNED_SHORT]: 65535,
  [ComponentType.UNSIGNED_INT]: 4294967295
};

const SIGNED = new Set<number>([ComponentType.BYTE, ComponentType.SHORT]);

/**
 * The float a normalized integer code stands for, e.g. BYTE -128 → -1, SHORT 16384 → 16384/32767.
 * Returns `code` unchanged for float component types.
 */
export function decodeNormalized(code: number, componentType: number): number {
  const divisor = NORMALIZATION_DIVISOR[componentType];
  if (divisor === undefined) return code;
  return SIGNED.has(componentType) ? Math.max(code / divisor, -1) : code / divisor;
}

/**
 * Smallest step between two decoded values: 1/127 for normalized BYTE, 1/32767 for SHORT and so on,
 * 1 for integers read without normalization, 0 for float32/float64. Half floats (KHR_accessor_float16)
 * get 2^-11, their spacing for magnitudes in [0.5, 1) (IEEE 754 binary16, 10-bit mantissa).
 */
export function quantizationStepOf(componentType: number, isNormalized: boolean): number {
  if (componentType === ComponentType.FLOAT || componentType === ComponentType.FLOAT64) return 0;
  if (componentType === ComponentType.FLOAT16) return 2 ** -11;
  const divisor = NORMALIZATION_DIVISOR[componentType];
  if (divisor === undefined) return 0;
  return isNormalized ? 1 / divisor : 1;
}

/**
 * Copies `count` elements of `componentsPerElement` components from `source` into `target`
 * (packed), decoding normalized integers. The n-th element is read at component index
 * `firstComponent + n * componentStride`: stride 4 for packed VEC4, 12 for one third of a
 * CUBICSPLINE output, the element size to keep one component of each element.
 * One tight loop, no allocation.
 */
export function copyElements(
  source: TypedArray,
  firstComponent: number,
  componentStride: number,
  target: Float32Array,
  count: number,
  componentsPerElement: number,
  componentType: number,
  isNormalized: boolean
): void {
  const divisor = isNormalized ? NORMALIZATION_DIVISOR[componentType] : undefined;
  let sourceIndex = firstComponent;
  let targetIndex = 0;
  if (divisor === undefined && componentsPerElement === 4) {
    // The common case (float32 quaternions) unrolled.
    for (let element = 0; element < count; element++, sourceIndex += componentStride, targetIndex += 4) {
      target[targetIndex] = source[sourceIndex];
      target[targetIndex + 1] = source[sourceIndex + 1];
      target[targetIndex + 2] = source[sourceIndex + 2];
      target[targetIndex + 3] = source[sourceIndex + 3];
    }
  } else if (divisor === undefined) {
    for (let element = 0; element < count; element++, sourceIndex += componentStride) {
      for (let component = 0; component < componentsPerElement; component++) {
        target[targetIndex++] = source[sourceIndex + component];
      }
    }
  } else if (SIGNED.has(componentType)) {
    for (let element = 0; element < count; element++, sourceIndex += componentStride) {
      for (let component = 0; component < componentsPerElement; component++) {
        const value = source[sourceIndex + component] / divisor;
        target[targetIndex++] = value < -1 ? -1 : value;
      }
    }
  } else {
    for (let element = 0; element < count; element++, sourceIndex += componentStride) {
      for (let component = 0; component < componentsPerElement; component++) {
        target[targetIndex++] = source[sourceIndex + component] / divisor;
      }
    }
  }
}

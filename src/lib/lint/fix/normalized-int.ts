/**
 * Normalized-integer encoding and decoding for animation outputs, exactly as the glTF 2.0 §3.11
 * table gives them:
 *
 * | componentType         | int → float            | float → int           |
 * | --------------------- | ---------------------- | --------------------- |
 * | BYTE (5120)           | max(c / 127, -1)       | c = round(f × 127)    |
 * | UNSIGNED_BYTE (5121)  | c / 255                | c = round(f × 255)    |
 * | SHORT (5122)          | max(c / 32767, -1)     | c = round(f × 32767)  |
 * | UNSIGNED_SHORT (5123) | c / 65535              | c = round(f × 65535)  |
 *
 * `round` is read as rounding half away from zero (C's `round`), not JavaScript's `Math.round`
 * (half up): it is symmetric, so −q encodes to exactly the negated codes of q, which the sign
 * fixes rely on to stay idempotent. Results are clamped to the type's range.
 */

/** The normalization divisor of each integer component type (its largest code). */
const DIVISORS: Readonly<Record<number, number>> = { 5120: 127, 5121: 255, 5122: 32767, 5123: 65535 };

/** Code range of each integer component type. */
const RANGES: Readonly<Record<number, readonly [number, number]>> = {
  5120: [-128, 127],
  5121: [0, 255],
  5122: [-32768, 32767],
  5123: [0, 65535],
  5125: [0, 4294967295]
};

/** True for the component types glTF §3.11 allows as normalized rotation outputs. */
export function isNormalizedIntType(componentType: number, isNormalized: boolean): boolean {
  return isNormalized && DIVISORS[componentType] !== undefined;
}

/** The float a stored component stands for; floats and non-normalized integers pass through. */
export function decodeComponent(code: number, componentType: number, isNormalized: boolean): number {
  const divisor = isNormalized ? DIVISORS[componentType] : undefined;
  if (divisor === undefined) return code;
  const value = code / divisor;
  return componentType === 5120 || componentType === 5122 ? Math.max(value, -1) : value;
}

/** The stored component for a float: §3.11 encoding for normalized integers, rounding for plain ones, as-is for floats. */
export function encodeComponent(value: number, componentType: number, isNormalized: boolean): number {
  const range = RANGES[componentType];
  if (range === undefined) return value;
  const divisor = isNormalized ? (DIVISORS[componentType] ?? 1) : 1;
  const code = roundHalfAwayFromZero(value * divisor);
  // `+ 0` turns -0 into 0: integer arrays store both the same, but callers compare codes.
  return Math.min(range[1], Math.max(range[0], code)) + 0;
}

function roundHalfAwayFromZero(value: number): number {
  return value < 0 ? -Math.round(-value) : Math.round(value);
}

/** Smallest step between decoded values (1/127 for BYTE, ...); 0 for floats. */
export function quantizationStepFor(componentType: number, isNormalized: boolean): number {
  const divisor = isNormalized ? DIVISORS[componentType] : undefined;
  if (divisor !== undefined) return 1 / divisor;
  return RANGES[componentType] === undefined ? 0 : 1;
}

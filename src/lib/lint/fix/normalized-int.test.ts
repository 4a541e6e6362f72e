import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { decodeComponent, encodeComponent, isNormalizedIntType, quantizationStepFor } from './normalized-int';

// Every expected value below follows the glTF 2.0 §3.11 normalization table:
// BYTE f = max(c/127, -1), c = round(f·127); UNSIGNED_BYTE f = c/255, c = round(f·255);
// SHORT f = max(c/32767, -1), c = round(f·32767); UNSIGNED_SHORT f = c/65535, c = round(f·65535).
const BYTE = 5120;
const UNSIGNED_BYTE = 5121;
const SHORT = 5122;
const UNSIGNED_SHORT = 5123;
const FLOAT = 5126;

describe('normalized integer encoding', () => {
  it.each([
    { componentType: BYTE, code: 127, expected: 1 },
    { componentType: BYTE, code: -127, expected: -1 },
    { componentType: BYTE, code: -128, expected: -1 }, // clamped by max(·, -1)
    { componentType: BYTE, code: 64, expected: 64 / 127 },
    { componentType: UNSIGNED_BYTE, code: 255, expected: 1 },
    { componentType: UNSIGNED_BYTE, code: 128, expected: 128 / 255 },
    { componentType: SHORT, code: -32768, expected: -1 },
    { componentType: SHORT, code: 16384, expected: 16384 / 32767 },
    { componentType: UNSIGNED_SHORT, code: 65535, expected: 1 }
  ])('decodes $componentType code $code as the §3.11 table says', ({ componentType, code, expected }) => {
    expect(decodeComponent(code, componentType, true)).toBeCloseTo(expected, 15);
  });

  it.each([
    { componentType: BYTE, value: Math.SQRT1_2, expected: 90 }, // round(0.70711·127 = 89.80)
    { componentType: BYTE, value: -Math.SQRT1_2, expected: -90 },
    { componentType: BYTE, value: 1, expected: 127 },
    { componentType: BYTE, value: -1, expected: -127 },
    { componentType: UNSIGNED_BYTE, value: 0.5, expected: 128 }, // round(127.5) = 128
    { componentType: SHORT, value: Math.SQRT1_2, expected: 23170 }, // round(23169.77)
    { componentType: UNSIGNED_SHORT, value: 0.25, expected: 16384 } // round(16383.75)
  ])('encodes $value for $componentType as round(f × divisor) = $expected', ({ componentType, value, expected }) => {
    expect(encodeComponent(value, componentType, true)).toBe(expected);
  });

  it('rounds halves away from zero, so a negated value encodes to the negated code', () => {
    // 0.5/127·127 = 0.5 exactly: C's round() gives 1 and -1 (JavaScript's Math.round would give 1 and -0).
    expect(encodeComponent(0.5 / 127, BYTE, true)).toBe(1);
    expect(encodeComponent(-0.5 / 127, BYTE, true)).toBe(-1);
    fc.assert(
      fc.property(fc.double({ min: -1, max: 1, noNaN: true }), (value) => {
        expect(encodeComponent(-value, SHORT, true)).toBe(-encodeComponent(value, SHORT, true) + 0);
      })
    );
  });

  it('clamps to the component type range', () => {
    expect(encodeComponent(1.5, BYTE, true)).toBe(127);
    expect(encodeComponent(-1.5, BYTE, true)).toBe(-128);
    expect(encodeComponent(-0.2, UNSIGNED_BYTE, true)).toBe(0);
  });

  it('round-trips every BYTE and SHORT code through decode and encode, except the clamped minimum', () => {
    for (let code = -127; code <= 127; code++)
      expect(encodeComponent(decodeComponent(code, BYTE, true), BYTE, true)).toBe(code);
    for (let code = -32767; code <= 32767; code += 7)
      expect(encodeComponent(decodeComponent(code, SHORT, true), SHORT, true)).toBe(code);
    expect(encodeComponent(decodeComponent(-128, BYTE, true), BYTE, true)).toBe(-127);
  });

  it('passes floats through and knows the step of each encoding', () => {
    expect(decodeComponent(0.123, FLOAT, false)).toBe(0.123);
    expect(encodeComponent(0.123, FLOAT, false)).toBe(0.123);
    expect(quantizationStepFor(BYTE, true)).toBe(1 / 127);
    expect(quantizationStepFor(UNSIGNED_SHORT, true)).toBe(1 / 65535);
    expect(quantizationStepFor(FLOAT, false)).toBe(0);
    expect(isNormalizedIntType(SHORT, true)).toBe(true);
    expect(isNormalizedIntType(SHORT, false)).toBe(false);
  });
});

import { describe, expect, it } from 'vitest';
import { copyElements, decodeNormalized, quantizationStepOf } from './decode-components';

// Every expected value below is the formula of the glTF 2.0 §3.11 accessor normalization table,
// worked by hand: BYTE max(c/127, -1), UNSIGNED_BYTE c/255, SHORT max(c/32767, -1), UNSIGNED_SHORT c/65535.
const TABLE = [
  { name: 'BYTE -128 → -1 (clamped)', code: -128, componentType: 5120, expected: -1 },
  { name: 'BYTE -127 → -1', code: -127, componentType: 5120, expected: -1 },
  { name: 'BYTE 127 → 1', code: 127, componentType: 5120, expected: 1 },
  { name: 'BYTE 0 → 0', code: 0, componentType: 5120, expected: 0 },
  { name: 'BYTE 64 → 64/127', code: 64, componentType: 5120, expected: 64 / 127 },
  { name: 'UNSIGNED_BYTE 255 → 1', code: 255, componentType: 5121, expected: 1 },
  { name: 'UNSIGNED_BYTE 128 → 128/255', code: 128, componentType: 5121, expected: 128 / 255 },
  { name: 'SHORT 32767 → 1', code: 32767, componentType: 5122, expected: 1 },
  { name: 'SHORT -32768 → -1 (clamped)', code: -32768, componentType: 5122, expected: -1 },
  { name: 'SHORT -32767 → -1', code: -32767, componentType: 5122, expected: -1 },
  { name: 'SHORT 16384 → 16384/32767', code: 16384, componentType: 5122, expected: 16384 / 32767 },
  { name: 'UNSIGNED_SHORT 65535 → 1', code: 65535, componentType: 5123, expected: 1 },
  { name: 'UNSIGNED_SHORT 32768 → 32768/65535', code: 32768, componentType: 5123, expected: 32768 / 65535 }
];

describe('decodeNormalized (glTF 2.0 §3.11 normalization table)', () => {
  for (const row of TABLE) {
    it(`decodes ${row.name}`, () => {
      expect(decodeNormalized(row.code, row.componentType)).toBe(row.expected);
    });
  }

  it('leaves float components unchanged', () => {
    expect(decodeNormalized(0.25, 5126)).toBe(0.25);
  });
});

describe('copyElements', () => {
  it('decodes a normalized SHORT array to the float32 nearest each table value', () => {
    const codes = new Int16Array([-32768, -32767, 0, 16384, 32767, -16384, 1, -1]);
    const target = new Float32Array(8);
    copyElements(codes, 0, 4, target, 2, 4, 5122, true);
    // glTF 2.0 §3.11 table, rounded once to float32 (Math.fround is the IEEE 754 rounding).
    const expected = [-1, -1, 0, 16384 / 32767, 1, -16384 / 32767, 1 / 32767, -1 / 32767].map(Math.fround);
    expect(Array.from(target)).toEqual(expected);
  });

  it('decodes a normalized BYTE array with the -128 clamp', () => {
    const codes = new Int8Array([-128, 127, 64, -64]);
    const target = new Float32Array(4);
    copyElements(codes, 0, 4, target, 1, 4, 5120, true);
    // glTF 2.0 §3.11 table: BYTE max(c/127, -1).
    expect(Array.from(target)).toEqual([-1, 1, 64 / 127, -64 / 127].map(Math.fround));
  });

  it('takes every third element when given a stride of 12 components (CUBICSPLINE values)', () => {
    // Layout per key (glTF 2.0 Appendix C): in-tangent, value, out-tangent; values here are 10k + component.
    const source = new Float32Array(24);
    for (let element = 0; element < 6; element++) {
      for (let component = 0; component < 4; component++) source[element * 4 + component] = element * 10 + component;
    }
    const values = new Float32Array(8);
    copyElements(source, 4, 12, values, 2, 4, 5126, false);
    expect(Array.from(values)).toEqual([10, 11, 12, 13, 40, 41, 42, 43]);
  });

  it('copies integers without normalization as plain numbers', () => {
    const target = new Float32Array(4);
    copyElements(new Uint8Array([0, 1, 2, 255]), 0, 4, target, 1, 4, 5121, false);
    expect(Array.from(target)).toEqual([0, 1, 2, 255]);
  });
});

describe('quantizationStepOf', () => {
  it('gives one code of each normalized integer type (glTF 2.0 §3.11 table divisors)', () => {
    expect(quantizationStepOf(5120, true)).toBe(1 / 127);
    expect(quantizationStepOf(5121, true)).toBe(1 / 255);
    expect(quantizationStepOf(5122, true)).toBe(1 / 32767);
    expect(quantizationStepOf(5123, true)).toBe(1 / 65535);
  });

  it('gives 0 for float32 and 1 for integers read without normalization', () => {
    expect(quantizationStepOf(5126, false)).toBe(0);
    expect(quantizationStepOf(5122, false)).toBe(1);
  });
});

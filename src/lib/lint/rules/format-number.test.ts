import { describe, expect, it } from 'vitest';
import {
  formatBytes,
  formatDegrees,
  formatDegreesPerSecond,
  formatNumber,
  formatQuaternion,
  formatSeconds
} from './format-number';

describe('formatNumber', () => {
  it.each([
    { input: 0.70710678, expected: '0.7071' },
    { input: 1, expected: '1' },
    { input: -2.5, expected: '-2.5' },
    { input: 0.000012345, expected: '1.23e-5' },
    { input: 123456789, expected: '1.23e8' },
    { input: 0, expected: '0' },
    { input: NaN, expected: 'NaN' },
    { input: Infinity, expected: 'Infinity' },
    { input: -Infinity, expected: '-Infinity' }
  ])('writes $input as $expected', ({ input, expected }) => {
    expect(formatNumber(input)).toBe(expected);
  });
});

describe('unit formatters', () => {
  it('writes degrees with one decimal from 1° up and two significant digits below', () => {
    expect(formatDegrees(152.34)).toBe('152.3°');
    expect(formatDegrees(90)).toBe('90°');
    expect(formatDegrees(0.0123)).toBe('0.012°');
  });

  it('writes fast speeds in whole degrees per second', () => {
    expect(formatDegreesPerSecond(5110.9)).toBe('5111°/s');
    expect(formatDegreesPerSecond(45.25)).toBe('45.3°/s');
  });

  it('writes seconds to the millisecond', () => {
    expect(formatSeconds(1 / 30)).toBe('0.033 s');
    expect(formatSeconds(2)).toBe('2 s');
  });

  it('writes quaternions component by component', () => {
    expect(formatQuaternion([0, 0, Math.SQRT1_2, Math.SQRT1_2])).toBe('(0, 0, 0.7071, 0.7071)');
  });

  it('writes byte counts in bytes, KiB or MiB', () => {
    expect(formatBytes(512)).toBe('512 bytes');
    expect(formatBytes(3 * 1024 + 512)).toBe('3.5 KiB');
    expect(formatBytes(5 * 1024 * 1024)).toBe('5 MiB');
  });
});

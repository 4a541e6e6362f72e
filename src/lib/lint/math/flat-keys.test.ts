import { describe, expect, it } from 'vitest';
import { dotAt, isUsableKey, lengthSquaredAt } from './flat-keys';

describe('flat key reads', () => {
  const values = [1, 2, 3, 4, 0.5, 0, 0, 0.5, 0, 0, 0, 0, NaN, 0, 0, 1];

  it('reads the squared length and dot product of keys stored four floats apart', () => {
    expect(lengthSquaredAt(values, 0)).toBe(30);
    expect(dotAt(values, 0, 4)).toBe(2.5);
  });

  it('calls finite keys of non-zero length usable, and zero or NaN keys not', () => {
    expect(isUsableKey(values, 0)).toBe(true);
    expect(isUsableKey(values, 8)).toBe(false);
    expect(isUsableKey(values, 12)).toBe(false);
  });
});

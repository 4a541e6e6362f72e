/**
 * Reads on quaternions stored flat, four floats per key (x, y, z, w), the layout of every
 * rotation channel. Rules call these on the few keys the channel digest marked, so clarity wins
 * over inlining here.
 */

/** |q|² of the key at `offset` (4 × key index). */
export function lengthSquaredAt(values: ArrayLike<number>, offset: number): number {
  return (
    values[offset] * values[offset] +
    values[offset + 1] * values[offset + 1] +
    values[offset + 2] * values[offset + 2] +
    values[offset + 3] * values[offset + 3]
  );
}

/** The 4D dot product of the keys at offsets `a` and `b`. */
export function dotAt(values: ArrayLike<number>, a: number, b: number): number {
  return (
    values[a] * values[b] +
    values[a + 1] * values[b + 1] +
    values[a + 2] * values[b + 2] +
    values[a + 3] * values[b + 3]
  );
}

/** A key the value rules can judge: finite, with non-zero length (the rest is not-a-rotation's). */
export function isUsableKey(values: ArrayLike<number>, offset: number): boolean {
  const lengthSquared = lengthSquaredAt(values, offset);
  return lengthSquared > 0 && lengthSquared < Infinity;
}

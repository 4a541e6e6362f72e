/**
 * The keys of one rotation sampler as plain arrays, the shape every key-level fix works on:
 * 4 components (x, y, z, w) per key, CUBICSPLINE tangents split out. Transforms decode an
 * accessor into one; the dashboard's preview builds one from a RotationChannel. Key fixes edit it
 * in place and mark which keys they changed, so only those are written back.
 */
export interface KeyCurve {
  keyCount: number;
  /** 4 × keyCount components. */
  values: Float64Array;
  /** CUBICSPLINE in-tangents (4 × keyCount), else null. */
  inTangents: Float64Array | null;
  /** CUBICSPLINE out-tangents (4 × keyCount), else null. */
  outTangents: Float64Array | null;
  /** 1 for each key a fix changed (value or tangent). */
  changedKeys: Uint8Array;
}

/** A curve over copies of the given arrays (Float32 or Float64), nothing marked changed. */
export function createKeyCurve(
  keyCount: number,
  values: ArrayLike<number>,
  inTangents: ArrayLike<number> | null = null,
  outTangents: ArrayLike<number> | null = null
): KeyCurve {
  const copy = (source: ArrayLike<number>) => Float64Array.from({ length: keyCount * 4 }, (_, i) => source[i]);
  return {
    keyCount,
    values: copy(values),
    inTangents: inTangents ? copy(inTangents) : null,
    outTangents: outTangents ? copy(outTangents) : null,
    changedKeys: new Uint8Array(keyCount)
  };
}

/** Number of keys marked changed. */
export function countChangedKeys(curve: KeyCurve): number {
  let count = 0;
  for (let keyIndex = 0; keyIndex < curve.keyCount; keyIndex++) count += curve.changedKeys[keyIndex];
  return count;
}

/** Multiplies key `keyIndex` and its tangents by `factor` and marks it changed. */
export function scaleKey(curve: KeyCurve, keyIndex: number, factor: number): void {
  const offset = keyIndex * 4;
  for (const array of [curve.values, curve.inTangents, curve.outTangents]) {
    if (!array) continue;
    // `+ 0` keeps negated zeros +0, so a flipped float key keeps the bytes of its zero components.
    for (let component = 0; component < 4; component++)
      array[offset + component] = array[offset + component] * factor + 0;
  }
  curve.changedKeys[keyIndex] = 1;
}

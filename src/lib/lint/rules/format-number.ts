/**
 * Number formatting for finding messages: short, readable, and never `1e+0`-style noise.
 * Messages are read by people in CI logs and mail, so values carry only the digits that matter.
 */

/**
 * A number with `significant` digits, trailing zeros dropped; tiny or huge values in exponent form.
 * @example formatNumber(0.70710678) → "0.7071"; formatNumber(0.000012345) → "1.23e-5"; formatNumber(NaN) → "NaN"
 */
export function formatNumber(value: number, significant = 4): string {
  if (Number.isNaN(value)) return 'NaN';
  if (value === Infinity) return 'Infinity';
  if (value === -Infinity) return '-Infinity';
  if (value === 0) return '0';
  const magnitude = Math.abs(value);
  if (magnitude < 1e-3 || magnitude >= 1e7) {
    const [mantissa, exponent] = value.toExponential(Math.max(0, significant - 2)).split('e');
    return `${trimZeros(mantissa)}e${exponent.replace('+', '')}`;
  }
  return trimZeros(value.toPrecision(significant));
}

/** An angle in degrees: one decimal from 1° up, two significant digits below. @example formatDegrees(152.34) → "152.3°" */
export function formatDegrees(angleDegrees: number): string {
  if (!Number.isFinite(angleDegrees)) return `${formatNumber(angleDegrees)}°`;
  const magnitude = Math.abs(angleDegrees);
  const text = magnitude >= 1 ? trimZeros(angleDegrees.toFixed(1)) : formatNumber(angleDegrees, 2);
  return `${text}°`;
}

/** An angular speed: whole degrees per second from 100°/s up, else as formatDegrees. @example formatDegreesPerSecond(5110.9) → "5111°/s" */
export function formatDegreesPerSecond(degreesPerSecond: number): string {
  if (Number.isFinite(degreesPerSecond) && Math.abs(degreesPerSecond) >= 100)
    return `${Math.round(degreesPerSecond)}°/s`;
  return `${formatDegrees(degreesPerSecond)}/s`;
}

/** A time in seconds with millisecond precision. @example formatSeconds(0.0333333) → "0.033 s" */
export function formatSeconds(timeSeconds: number): string {
  if (!Number.isFinite(timeSeconds)) return `${formatNumber(timeSeconds)} s`;
  return `${trimZeros(timeSeconds.toFixed(3))} s`;
}

/** A quaternion as `(x, y, z, w)` with four significant digits per component. */
export function formatQuaternion(values: ArrayLike<number>, offset = 0): string {
  const parts: string[] = [];
  for (let c = 0; c < 4; c++) parts.push(formatNumber(values[offset + c]));
  return `(${parts.join(', ')})`;
}

/** A byte count: `512 bytes`, `3.4 KiB`, `1.2 MiB`. */
export function formatBytes(byteLength: number): string {
  if (byteLength < 1024) return `${byteLength} bytes`;
  if (byteLength < 1024 * 1024) return `${formatNumber(byteLength / 1024, 3)} KiB`;
  return `${formatNumber(byteLength / (1024 * 1024), 3)} MiB`;
}

function trimZeros(text: string): string {
  return text.includes('.') ? text.replace(/\.?0+$/, '') : text;
}

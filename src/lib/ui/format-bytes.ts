/**
 * A byte length as a short string in binary units: `0 B`, `512 B`, `1.5 KiB`, `24 MiB`.
 * Asset sizes are compared across builds, so the unit is always binary (1 KiB = 1024 B) and never switches meaning;
 * one decimal below 10 units, whole numbers above.
 */
export function formatBytes(byteLength: number): string {
  if (!Number.isFinite(byteLength) || byteLength < 0) return '—';
  if (byteLength < 1024) return `${Math.round(byteLength)} B`;
  let value = byteLength;
  let unitIndex = -1;
  do {
    value /= 1024;
    unitIndex += 1;
  } while (value >= 1024 && unitIndex < BINARY_UNITS.length - 1);
  // 1023.96 KiB would print as "1024 KiB"; carry it to the next unit instead.
  if (Math.round(value) >= 1024 && unitIndex < BINARY_UNITS.length - 1) {
    value /= 1024;
    unitIndex += 1;
  }
  const text = value < 10 ? trimZero(value.toFixed(1)) : String(Math.round(value));
  return `${text} ${BINARY_UNITS[unitIndex]}`;
}

const BINARY_UNITS = ['KiB', 'MiB', 'GiB', 'TiB'] as const;

function trimZero(text: string): string {
  return text.endsWith('.0') ? text.slice(0, -2) : text;
}

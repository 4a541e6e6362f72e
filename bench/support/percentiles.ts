/**
 * Percentiles of request timings, by the nearest-rank method (the smallest value with at least
 * p % of the values at or below it), so a reported p95 is a time one request really took.
 */

/** The `percent` percentile of `values` (any order), or NaN for no values. */
export function percentile(values: readonly number[], percent: number): number {
  if (values.length === 0) return Number.NaN;
  const sorted = [...values].sort((a, b) => a - b);
  const rank = Math.ceil((percent / 100) * sorted.length);
  return sorted[Math.min(sorted.length, Math.max(1, rank)) - 1];
}

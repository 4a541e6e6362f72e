/**
 * A one-sentence text alternative for a small trend chart: how many points, first and latest value, and the range.
 * Charts are canvases; this sentence is what a screen reader (or a reader who cannot tell the line's slope) gets.
 *
 * @example describeTrend([12, 9, 4], 'findings', 'build') → "3 builds: 12 findings at first, 4 in the latest (fewer); range 4–12."
 */
export function describeTrend(values: readonly number[], noun: string, pointNoun = 'build'): string {
  if (values.length === 0) return `No ${pointNoun}s yet.`;
  const first = values[0];
  const latest = values[values.length - 1];
  if (values.length === 1) return `1 ${pointNoun}: ${formatCount(latest)} ${noun}.`;
  const lowest = Math.min(...values);
  const highest = Math.max(...values);
  const direction = latest < first ? 'fewer' : latest > first ? 'more' : 'unchanged';
  const range =
    lowest === highest ? `steady at ${formatCount(lowest)}` : `range ${formatCount(lowest)}–${formatCount(highest)}`;
  return `${values.length} ${pointNoun}s: ${formatCount(first)} ${noun} at first, ${formatCount(latest)} in the latest (${direction}); ${range}.`;
}

function formatCount(value: number): string {
  return value.toLocaleString('en-GB');
}

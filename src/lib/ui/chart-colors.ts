/**
 * Colours for chart.js canvases, copied from the Tailwind palette (tailwind.config.js) because a canvas cannot read
 * utility classes. `chart-colors.test.ts` fails when the two drift apart, so change both together.
 */
export const CHART_COLORS = {
  /** Main series line: ink-600. */
  line: '#4D5866',
  /** Area under a series: ink-600 at low alpha. */
  lineFill: 'rgba(77, 88, 102, 0.07)',
  /** Gridlines and baselines: ink-100. */
  grid: '#EBEEF1',
  /** Axis tick labels: ink-500. */
  tick: '#5F6A78',
  /** The newest point, so the eye lands on "now": accent-700. */
  latest: '#3A45B0',
  error: '#C8321F',
  warning: '#B86A00',
  info: '#1A7F96',
  pass: '#23844A',
  fail: '#C22A3F'
} as const;

/** Names of {@link CHART_COLORS}. */
export type ChartColorName = keyof typeof CHART_COLORS;

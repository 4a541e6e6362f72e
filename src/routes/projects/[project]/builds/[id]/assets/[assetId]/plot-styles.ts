/**
 * Colours, dash patterns and point shapes of the asset view's plots. Severity colours come from
 * CHART_COLORS (copies of the Tailwind palette); the four quaternion components get muted hues
 * that clash with no severity, verdict or the accent, and each also has its own dash pattern, so
 * the curves stay apart in print and for colour-blind readers.
 */
import type { PointStyle } from 'chart.js';
import type { Severity } from '$lib/lint/finding';

/** A quaternion component's curve style. */
export interface ComponentStyle {
  name: 'x' | 'y' | 'z' | 'w';
  color: string;
  /** Canvas line dash; empty for solid. */
  dash: number[];
}

/** x solid ink, y long-dashed plum, z dotted olive, w dash-dotted slate. */
export const COMPONENT_STYLES: readonly ComponentStyle[] = [
  { name: 'x', color: '#1B222C', dash: [] },
  { name: 'y', color: '#8A3F8F', dash: [7, 3] },
  { name: 'z', color: '#5E6B1E', dash: [2, 2] },
  { name: 'w', color: '#4D7A99', dash: [8, 3, 2, 3] }
];

/** Marker shapes per severity, matching the severity icons: square, triangle, circle. */
export const SEVERITY_POINT_STYLE: Record<Severity, PointStyle> = {
  error: 'rect',
  warning: 'triangle',
  info: 'circle'
};

/** Plot colours beyond CHART_COLORS. */
export const PLOT_COLORS = {
  /** A single series (length, speed): ink-900. */
  series: '#1B222C',
  /** Stored curves behind an "after fix" preview: ink-300. */
  stored: '#B6BEC8',
  /** The curve after the fix: verdict-pass icon. */
  fixed: '#23844A',
  /** The policy's speed maximum: ink-700. */
  limit: '#3A4451',
  /** The selected finding's key: accent-600, the selection colour of tables. */
  selected: '#4450C2',
  /** Warning tolerance edge and band: sev-warning icon and bg. */
  warningEdge: '#B86A00',
  warningBand: 'rgba(255, 244, 219, 0.85)',
  /** Error tolerance edge and band: sev-error icon and bg. */
  errorEdge: '#C8321F',
  errorBand: 'rgba(253, 236, 234, 0.9)'
} as const;

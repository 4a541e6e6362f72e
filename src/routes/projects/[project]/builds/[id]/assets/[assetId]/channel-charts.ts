/**
 * Chart.js configurations of the asset view's three channel plots: the quaternion components over
 * time, the quaternion length against the policy's unit tolerances, and the angular speed against
 * the policy's maximum. Each marks the channel's findings at their keys, one point shape per
 * severity (square, triangle, circle: the shapes of the severity icons), and the selected key.
 */
import type { ChartConfiguration, ChartDataset, Plugin, ScatterDataPoint } from 'chart.js';
import type { Severity } from '$lib/lint/finding';
import type { ChannelMarker } from '$lib/server/builds/get-asset-channels';
import { CHART_COLORS } from '$lib/ui/chart-colors';
import type { KeySeries } from './channel-math';
import { COMPONENT_STYLES, PLOT_COLORS, SEVERITY_POINT_STYLE } from './plot-styles';

/** What every plot of a channel needs. */
export interface ChannelPlotInput {
  /** The stored keys. */
  stored: KeySeries;
  /** The keys after the preview fix, when "Show after fix" is on. */
  fixed: KeySeries | null;
  markers: ChannelMarker[];
  /** Finding whose key is highlighted; null for none. */
  selectedFindingId: number | null;
  /** Called with a finding id when the reader clicks its marker. */
  onMarkerClick?: (findingId: number) => void;
}

type Point = ScatterDataPoint;
type LineConfig = ChartConfiguration<'line', Point[]>;
type LineDataset = ChartDataset<'line', Point[]> & { findingIds?: number[] };

const SEVERITY_ORDER: Severity[] = ['error', 'warning', 'info'];
const SEVERITY_NAME: Record<Severity, string> = { error: 'Error', warning: 'Warning', info: 'Info' };

/** x, y, z and w over time; with a fix preview, the stored curves turn grey and the fixed ones take the colours. */
export function componentsChart(input: ChannelPlotInput): LineConfig {
  const { stored, fixed } = input;
  const datasets: LineDataset[] = [];
  for (const style of COMPONENT_STYLES) {
    datasets.push(
      curve(`${style.name}${fixed ? ' (stored)' : ''}`, stored.times, stored[style.name], {
        borderColor: fixed ? PLOT_COLORS.stored : style.color,
        borderDash: style.dash,
        borderWidth: fixed ? 1 : 1.5
      })
    );
  }
  if (fixed) {
    for (const style of COMPONENT_STYLES) {
      datasets.push(
        curve(`${style.name} after fix`, fixed.times, fixed[style.name], {
          borderColor: style.color,
          borderDash: style.dash,
          borderWidth: 1.75
        })
      );
    }
  }
  const shown = fixed ?? stored;
  datasets.push(
    ...markerDatasets(input, (keyIndex) =>
      COMPONENT_STYLES.map((style) => ({ x: shown.times[keyIndex], y: shown[style.name][keyIndex] }))
    )
  );
  // Unit quaternions keep every component within [-1, 1]; a fixed range keeps channels comparable at a glance.
  const components = [stored, ...(fixed ? [fixed] : [])].flatMap((series) => [
    ...series.x,
    ...series.y,
    ...series.z,
    ...series.w
  ]);
  const bound = 1.05 * Math.max(1, ...components.filter(Number.isFinite).map(Math.abs));
  return lineConfig(datasets, input, { title: 'Component value', min: -bound, max: bound });
}

/** |q| per key, with the policy's warning and error bands shaded above and below 1. */
export function lengthChart(
  input: ChannelPlotInput,
  tolerances: { unitWarning: number; unitError: number }
): LineConfig {
  const { stored, fixed } = input;
  const start = stored.times[0] ?? 0;
  const end = stored.times[stored.times.length - 1] ?? 1;
  const flat = (y: number): Point[] => [
    { x: start, y },
    { x: end, y }
  ];
  const band = (label: string, y: number, fill: LineDataset['fill'], color: string): LineDataset => ({
    label,
    data: flat(y),
    borderColor: color,
    borderWidth: 1,
    borderDash: [2, 3],
    backgroundColor: color === PLOT_COLORS.errorEdge ? PLOT_COLORS.errorBand : PLOT_COLORS.warningBand,
    fill,
    pointRadius: 0,
    pointHitRadius: 0
  });
  const { unitWarning, unitError } = tolerances;
  // Order matters: the warning bands fill towards the error edges, which are datasets 0 and 1.
  const datasets: LineDataset[] = [
    band('Error above', 1 + unitError, 'end', PLOT_COLORS.errorEdge),
    band('Error below', 1 - unitError, 'start', PLOT_COLORS.errorEdge),
    band('Warning above', 1 + unitWarning, 0, PLOT_COLORS.warningEdge),
    band('Warning below', 1 - unitWarning, 1, PLOT_COLORS.warningEdge),
    curve(fixed ? 'Length (stored)' : 'Length', stored.times, stored.length, {
      borderColor: fixed ? PLOT_COLORS.stored : PLOT_COLORS.series,
      borderWidth: fixed ? 1 : 1.5
    })
  ];
  if (fixed) {
    datasets.push(
      curve('Length after fix', fixed.times, fixed.length, { borderColor: PLOT_COLORS.fixed, borderWidth: 1.75 })
    );
  }
  const shown = fixed ?? stored;
  datasets.push(...markerDatasets(input, (keyIndex) => [{ x: shown.times[keyIndex], y: shown.length[keyIndex] }]));
  const lengths = [...stored.length, ...(fixed?.length ?? [])].filter(Number.isFinite);
  const spread = Math.max(unitError * 1.6, ...lengths.map((length) => Math.abs(length - 1) * 1.1));
  return lineConfig(datasets, input, {
    title: 'Length |q|',
    suggestedMin: 1 - spread,
    suggestedMax: 1 + spread,
    digits: 4
  });
}

/**
 * Angular speed per segment (plotted at the segment's middle) with the policy's maximum as a dashed line,
 * drawn when it falls within reach of the curve so a slow channel is not squashed flat under it.
 */
export function speedChart(
  input: ChannelPlotInput,
  maxSpeedDegreesPerSecond: number
): LineConfig & {
  isMaximumShown: boolean;
} {
  const { stored, fixed } = input;
  const speedPoints = (series: KeySeries): Point[] =>
    series.speedDegreesPerSecond.map((speed, segment) => ({
      x: (series.times[segment] + series.times[segment + 1]) / 2,
      y: speed ?? Number.NaN
    }));
  const datasets: LineDataset[] = [
    {
      ...curveStyle(fixed ? PLOT_COLORS.stored : PLOT_COLORS.series, fixed ? 1 : 1.5),
      label: fixed ? 'Speed (stored)' : 'Speed',
      data: speedPoints(stored),
      spanGaps: false
    }
  ];
  if (fixed) {
    datasets.push({
      ...curveStyle(PLOT_COLORS.fixed, 1.75),
      label: 'Speed after fix',
      data: speedPoints(fixed),
      spanGaps: false
    });
  }
  const speeds = [...stored.speedDegreesPerSecond, ...(fixed?.speedDegreesPerSecond ?? [])].filter(
    (speed): speed is number => speed !== null && Number.isFinite(speed)
  );
  const highest = Math.max(0, ...speeds);
  const isMaximumShown = maxSpeedDegreesPerSecond <= Math.max(highest * 2, 1);
  if (isMaximumShown && stored.times.length > 0) {
    datasets.push({
      label: 'Policy maximum',
      data: [
        { x: stored.times[0], y: maxSpeedDegreesPerSecond },
        { x: stored.times[stored.times.length - 1], y: maxSpeedDegreesPerSecond }
      ],
      borderColor: PLOT_COLORS.limit,
      borderWidth: 1.5,
      borderDash: [8, 4],
      pointRadius: 0,
      pointHitRadius: 0,
      fill: false
    });
  }
  const shown = fixed ?? stored;
  datasets.push(
    ...markerDatasets(input, (keyIndex, keyLastIndex) => {
      // A finding about keys k..k+n is about the segment leaving k; one about a single key, the segment reaching it.
      const segment = keyLastIndex > keyIndex ? keyIndex : keyIndex - 1;
      const speed = shown.speedDegreesPerSecond[segment];
      if (segment < 0 || speed === null || speed === undefined) return [];
      return [{ x: (shown.times[segment] + shown.times[segment + 1]) / 2, y: speed }];
    })
  );
  const config = lineConfig(datasets, input, {
    title: 'Degrees per second',
    suggestedMin: 0,
    suggestedMax: isMaximumShown ? Math.max(highest, maxSpeedDegreesPerSecond) * 1.1 : highest * 1.15,
    digits: 1
  });
  return { ...config, isMaximumShown };
}

function curve(
  label: string,
  times: number[],
  values: number[],
  style: { borderColor: string; borderWidth: number; borderDash?: number[] }
): LineDataset {
  return {
    ...curveStyle(style.borderColor, style.borderWidth),
    borderDash: style.borderDash ?? [],
    label,
    data: times.map((x, index) => ({ x, y: values[index] }))
  };
}

function curveStyle(color: string, width: number): Partial<LineDataset> {
  return {
    borderColor: color,
    backgroundColor: color,
    borderWidth: width,
    pointRadius: 0,
    pointHoverRadius: 3,
    pointHitRadius: 4,
    tension: 0,
    fill: false
  };
}

/** One scatter dataset per severity with findings: points at `pointsAt(keyFirst, keyLast)` for each finding on a key. */
function markerDatasets(
  input: ChannelPlotInput,
  pointsAt: (keyIndex: number, keyLastIndex: number) => Point[]
): LineDataset[] {
  const datasets: LineDataset[] = [];
  for (const severity of SEVERITY_ORDER) {
    const data: Point[] = [];
    const findingIds: number[] = [];
    const radii: number[] = [];
    for (const marker of input.markers) {
      if (marker.severity !== severity || marker.keyIndex === null) continue;
      const isSelected = marker.findingId === input.selectedFindingId;
      for (const point of pointsAt(marker.keyIndex, marker.keyLastIndex ?? marker.keyIndex)) {
        if (!Number.isFinite(point.y)) continue;
        data.push(point);
        findingIds.push(marker.findingId);
        radii.push(isSelected ? 8 : 5.5);
      }
    }
    if (data.length === 0) continue;
    datasets.push({
      label: `${SEVERITY_NAME[severity]} finding`,
      data,
      findingIds,
      showLine: false,
      pointStyle: SEVERITY_POINT_STYLE[severity],
      pointRadius: radii,
      pointHoverRadius: radii.map((radius) => radius + 1.5),
      pointHitRadius: 8,
      pointBackgroundColor: CHART_COLORS[severity],
      pointBorderColor: '#FFFFFF',
      pointBorderWidth: 1.5,
      borderColor: CHART_COLORS[severity],
      order: -1
    });
  }
  return datasets;
}

function lineConfig(
  datasets: LineDataset[],
  input: ChannelPlotInput,
  axis: { title: string; min?: number; max?: number; suggestedMin?: number; suggestedMax?: number; digits?: number }
): LineConfig {
  const selected = input.markers.find((marker) => marker.findingId === input.selectedFindingId);
  const selectedTime =
    selected && selected.keyIndex !== null ? (input.fixed ?? input.stored).times[selected.keyIndex] : undefined;
  const digits = axis.digits ?? 2;
  return {
    type: 'line',
    data: { datasets },
    plugins: selectedTime === undefined ? [] : [selectedKeyLine(selectedTime)],
    options: {
      animation: false,
      responsive: true,
      maintainAspectRatio: false,
      parsing: false,
      normalized: true,
      interaction: { mode: 'nearest', intersect: false, axis: 'x' },
      scales: {
        x: {
          type: 'linear',
          title: { display: true, text: 'Time (s)', color: CHART_COLORS.tick, font: { size: 11 } },
          grid: { color: CHART_COLORS.grid },
          ticks: { color: CHART_COLORS.tick, font: { size: 11 } }
        },
        y: {
          type: 'linear',
          min: axis.min,
          max: axis.max,
          suggestedMin: axis.suggestedMin,
          suggestedMax: axis.suggestedMax,
          title: { display: true, text: axis.title, color: CHART_COLORS.tick, font: { size: 11 } },
          grid: { color: CHART_COLORS.grid },
          ticks: {
            color: CHART_COLORS.tick,
            font: { size: 11 },
            // A fixed range (components) keeps round ticks; its ±1.05 edges are margin, not values worth a label.
            includeBounds: axis.min === undefined,
            callback: (value) => Number(value).toFixed(digits)
          }
        }
      },
      plugins: {
        legend: { display: false },
        tooltip: {
          filter: (item) => !/^(Error|Warning) (above|below)$/.test(item.dataset.label ?? ''),
          callbacks: {
            title: (items) => (items[0] ? `t = ${(items[0].parsed.x ?? 0).toFixed(3)} s` : ''),
            label: (item) => `${item.dataset.label}: ${(item.parsed.y ?? 0).toFixed(digits + 2)}`
          }
        }
      },
      onClick: (event, _elements, chart) => {
        if (!input.onMarkerClick || !event.native) return;
        // Only a point under the pointer counts: the tooltip's "nearest" would select a marker from anywhere.
        for (const element of chart.getElementsAtEventForMode(event.native, 'point', { intersect: true }, false)) {
          const dataset = chart.data.datasets[element.datasetIndex] as LineDataset;
          const findingId = dataset.findingIds?.[element.index];
          if (findingId !== undefined) return input.onMarkerClick(findingId);
        }
      }
    }
  };
}

/** A dashed vertical line at the selected finding's key, drawn under the datasets. */
function selectedKeyLine(timeSeconds: number): Plugin<'line'> {
  return {
    id: 'selectedKeyLine',
    beforeDatasetsDraw(chart) {
      const x = chart.scales.x.getPixelForValue(timeSeconds);
      const { top, bottom } = chart.chartArea;
      const context = chart.ctx;
      context.save();
      context.strokeStyle = PLOT_COLORS.selected;
      context.lineWidth = 1.5;
      context.setLineDash([4, 3]);
      context.beginPath();
      context.moveTo(x, top);
      context.lineTo(x, bottom);
      context.stroke();
      context.restore();
    }
  };
}

/**
 * chart.js configurations for the trends page, from the trends API's builds (oldest first): open
 * findings by severity, open findings by rule (stacked), and assets checked, one category per
 * build. Colours come from CHART_COLORS (copies of the palette) and, for rules, a small
 * categorical set; every series also appears in the panel's table, so colour is never the only key.
 */
import type { ChartConfiguration, ChartOptions, TooltipItem } from 'chart.js';
import type { TrendPointView } from '$lib/server/builds/list-trend';
import { CHART_COLORS } from '$lib/ui/chart-colors';

/** Rules drawn as their own series; the rest share one grey "other rules" series. */
export const MAX_RULE_SERIES = 8;

/**
 * Categorical colours for rule series: muted hues apart from the accent and the severity colours,
 * so a rule never reads as a severity. Chosen for contrast on white (each ≥ 3:1, common practice for
 * chart marks, WCAG 2.2 SC 1.4.11) and ordered so neighbours in a stack differ in lightness.
 */
export const RULE_COLORS = ['#2A7F7A', '#A8741A', '#7E4A8C', '#4A6FA5', '#6B7D2E', '#B0532E', '#A8456B', '#56788A'];
/** The "other rules" series: ink-400. */
export const OTHER_RULES_COLOR = '#8B95A1';

/** The x-axis word for a build: its label, else its id. */
export function buildLabel(build: Pick<TrendPointView, 'label' | 'buildId'>): string {
  return build.label ?? `#${build.buildId}`;
}

/** One series of the rules chart: a rule id (or null for the grouped rest) with its colour and counts per build. */
export interface RuleSeries {
  rule: string | null;
  color: string;
  counts: number[];
  total: number;
}

/** The rules with the most open findings over the builds, heaviest first, the rest grouped. */
export function ruleSeriesOf(builds: readonly TrendPointView[]): RuleSeries[] {
  const totals = new Map<string, number>();
  for (const build of builds) {
    for (const [rule, count] of Object.entries(build.byRule)) totals.set(rule, (totals.get(rule) ?? 0) + count);
  }
  const ranked = [...totals.entries()].sort((a, b) => b[1] - a[1] || a[0].localeCompare(b[0]));
  const shown = ranked.slice(0, ranked.length > MAX_RULE_SERIES ? MAX_RULE_SERIES - 1 : MAX_RULE_SERIES);
  const series: RuleSeries[] = shown.map(([rule, total], index) => ({
    rule,
    color: RULE_COLORS[index % RULE_COLORS.length],
    counts: builds.map((build) => build.byRule[rule] ?? 0),
    total
  }));
  if (ranked.length > shown.length) {
    const shownRules = new Set(shown.map(([rule]) => rule));
    const counts = builds.map((build) =>
      Object.entries(build.byRule).reduce((sum, [rule, count]) => (shownRules.has(rule) ? sum : sum + count), 0)
    );
    series.push({ rule: null, color: OTHER_RULES_COLOR, counts, total: counts.reduce((a, b) => a + b, 0) });
  }
  return series;
}

/** Open findings by severity: one line each, with the severity's own point shape (square, triangle, circle). */
export function severityChartConfig(builds: readonly TrendPointView[]): ChartConfiguration<'line'> {
  const series = [
    { key: 'error', label: 'Errors', color: CHART_COLORS.error, pointStyle: 'rect' },
    { key: 'warning', label: 'Warnings', color: CHART_COLORS.warning, pointStyle: 'triangle' },
    { key: 'info', label: 'Info', color: CHART_COLORS.info, pointStyle: 'circle' }
  ] as const;
  return {
    type: 'line',
    data: {
      labels: builds.map(buildLabel),
      datasets: series.map(({ key, label, color, pointStyle }) => ({
        label,
        data: builds.map((build) => build.counts[key]),
        borderColor: color,
        backgroundColor: color,
        borderWidth: 1.75,
        pointStyle,
        pointRadius: builds.length > 60 ? 0 : 3,
        pointHoverRadius: 4,
        tension: 0
      }))
    },
    options: baseOptions<'line'>(builds, false)
  };
}

/** Open findings by rule, stacked per build. */
export function ruleChartConfig(
  builds: readonly TrendPointView[],
  series: readonly RuleSeries[]
): ChartConfiguration<'bar'> {
  return {
    type: 'bar',
    data: {
      labels: builds.map(buildLabel),
      datasets: series.map((entry) => ({
        label: entry.rule ?? 'Other rules',
        data: entry.counts,
        backgroundColor: entry.color,
        borderColor: '#FFFFFF',
        borderWidth: { top: 1, right: 0, bottom: 0, left: 0 },
        maxBarThickness: 28
      }))
    },
    options: baseOptions<'bar'>(builds, true)
  };
}

/** Assets checked per build. */
export function assetsChartConfig(builds: readonly TrendPointView[]): ChartConfiguration<'bar'> {
  return {
    type: 'bar',
    data: {
      labels: builds.map(buildLabel),
      datasets: [
        {
          label: 'Assets checked',
          data: builds.map((build) => build.assets),
          backgroundColor: CHART_COLORS.line,
          maxBarThickness: 28
        }
      ]
    },
    options: baseOptions<'bar'>(builds, false)
  };
}

function baseOptions<T extends 'bar' | 'line'>(builds: readonly TrendPointView[], isStacked: boolean): ChartOptions<T> {
  const options = {
    responsive: true,
    maintainAspectRatio: false,
    animation: false,
    interaction: { mode: 'index' as const, intersect: false },
    plugins: {
      legend: { display: false },
      tooltip: {
        callbacks: {
          title: (items: TooltipItem<'bar' | 'line'>[]) => {
            const build = builds[items[0]?.dataIndex ?? 0];
            return build ? `${buildLabel(build)} · ${build.createdAt.slice(0, 16).replace('T', ' ')} UTC` : '';
          }
        }
      }
    },
    scales: {
      x: {
        stacked: isStacked,
        grid: { display: false },
        ticks: { color: CHART_COLORS.tick, maxRotation: 0, autoSkip: true, autoSkipPadding: 12, font: { size: 11 } }
      },
      y: {
        stacked: isStacked,
        beginAtZero: true,
        suggestedMax: 4,
        grid: { color: CHART_COLORS.grid },
        border: { display: false },
        ticks: { color: CHART_COLORS.tick, precision: 0, font: { size: 11 } }
      }
    }
  };
  // One set of options serves bars and lines; chart.js's per-type option types do not unify generically.
  return options as unknown as ChartOptions<T>;
}

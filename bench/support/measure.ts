/**
 * Timing and reporting helpers shared by the benches: median and fastest wall time over repeated runs,
 * peak memory, and one table printed both as aligned text and as markdown for the README.
 */

/** Wall time in milliseconds of one call. */
export async function timeOnce(run: () => unknown): Promise<number> {
  const start = process.hrtime.bigint();
  await run();
  return Number(process.hrtime.bigint() - start) / 1e6;
}

/** Fastest and median wall time of repeated runs, and their median CPU time, in milliseconds. */
export interface Timing {
  minMs: number;
  medianMs: number;
  /**
   * Median CPU time of the process (user + system, every thread: GC and compiler threads too).
   * On a busy machine it moves much less than wall time, which also counts the time the
   * process waited for a core.
   */
  cpuMedianMs: number;
}

/**
 * Wall time over `runs` calls after `warmups` untimed ones, with a full GC before each timed call
 * (the process runs with --expose-gc) so collection of the previous run's garbage is not billed
 * to the next. `setup` runs untimed before every call, to give each run fresh inputs (rules cache
 * per channel object, so reusing channels would time cache hits). The median is the figure to
 * judge; the minimum shows what the code does when the machine is not busy with anything else.
 */
export async function measureMs(
  run: () => unknown,
  runs: number,
  warmups = 2,
  setup: () => unknown = () => undefined
): Promise<Timing> {
  for (let index = 0; index < warmups; index++) {
    await setup();
    await run();
  }
  const times: number[] = [];
  const cpuTimes: number[] = [];
  for (let index = 0; index < runs; index++) {
    await setup();
    collectGarbage();
    const cpuBefore = process.cpuUsage();
    times.push(await timeOnce(run));
    const cpu = process.cpuUsage(cpuBefore);
    cpuTimes.push((cpu.user + cpu.system) / 1000);
  }
  times.sort((a, b) => a - b);
  cpuTimes.sort((a, b) => a - b);
  const middle = Math.floor(runs / 2);
  return { minMs: times[0], medianMs: times[middle], cpuMedianMs: cpuTimes[middle] };
}

/** Median wall time in milliseconds; see {@link measureMs}. */
export async function medianMs(
  run: () => unknown,
  runs: number,
  warmups = 2,
  setup: () => unknown = () => undefined
): Promise<number> {
  return (await measureMs(run, runs, warmups, setup)).medianMs;
}

/** A timing as "median ms (min …, CPU …)". */
export function formatTiming(timing: Timing): string {
  return `${timing.medianMs.toFixed(1)} ms (min ${timing.minMs.toFixed(1)}, CPU ${timing.cpuMedianMs.toFixed(1)})`;
}

/** Runs a full GC when the process was started with --expose-gc. */
export function collectGarbage(): void {
  (globalThis as { gc?: () => void }).gc?.();
}

/** One row of a bench table: what was measured, its value, and the target it is held to. */
export interface BenchRow {
  measure: string;
  value: string;
  target?: string;
  /** True when the value meets the target; undefined when the row has no target. */
  isMet?: boolean;
}

/** The table as aligned plain text, one row per line. */
export function formatTable(title: string, rows: BenchRow[]): string {
  const cells = [['Measure', 'Value', 'Target', 'Result'], ...rows.map(rowCells)];
  const widths = cells[0].map((_, column) => Math.max(...cells.map((row) => row[column].length)));
  const line = (row: string[]) =>
    row
      .map((cell, column) => cell.padEnd(widths[column]))
      .join('  ')
      .trimEnd();
  const rule = widths.map((width) => '-'.repeat(width)).join('  ');
  return [title, '', line(cells[0]), rule, ...cells.slice(1).map(line)].join('\n');
}

/** The same table as GitHub-flavoured markdown. */
export function formatMarkdownTable(rows: BenchRow[]): string {
  const escape = (cell: string) => cell.replace(/\|/g, '\\|');
  const lines = ['| Measure | Value | Target | Result |', '| --- | ---: | --- | --- |'];
  for (const row of rows) lines.push(`| ${rowCells(row).map(escape).join(' | ')} |`);
  return lines.join('\n');
}

function rowCells(row: BenchRow): string[] {
  const result = row.isMet === undefined ? '' : row.isMet ? 'PASS' : 'MISS';
  return [row.measure, row.value, row.target ?? '', result];
}

/** Bytes as MB with one decimal (1 MB = 2^20 bytes). */
export function formatMegabytes(byteLength: number): string {
  return `${(byteLength / 2 ** 20).toFixed(1)} MB`;
}

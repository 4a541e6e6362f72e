/**
 * Sentences that say in words what each channel plot shows, for the charts' accessible names: the
 * same numbers a sighted reader takes from the curves (ranges, peaks, keys outside tolerance).
 */
import type { ChannelMarker } from '$lib/server/builds/get-asset-channels';
import { plural } from '$lib/ui/plural';
import type { KeySeries } from './channel-math';

/** "91 keys from 0.000 s to 3.000 s; components between -0.707 and 1.000; 2 findings marked." */
export function describeComponents(series: KeySeries, markers: ChannelMarker[]): string {
  const values = [...series.x, ...series.y, ...series.z, ...series.w].filter(Number.isFinite);
  const marked = markers.filter((marker) => marker.keyIndex !== null).length;
  return [
    `${plural(series.times.length, 'key')} from ${timeText(series.times[0])} to ${timeText(series.times.at(-1))}`,
    values.length > 0
      ? `components between ${Math.min(...values).toFixed(3)} and ${Math.max(...values).toFixed(3)}`
      : '',
    `${plural(marked, 'finding')} marked`
  ]
    .filter(Boolean)
    .join('; ');
}

/** "Length between 0.99990 and 1.02000; 31 keys beyond the warning tolerance of 0.001, 12 beyond the error tolerance of 0.01." */
export function describeLength(series: KeySeries, tolerances: { unitWarning: number; unitError: number }): string {
  const lengths = series.length.filter(Number.isFinite);
  if (lengths.length === 0) return 'No key has a finite length.';
  const beyond = (tolerance: number) => lengths.filter((length) => Math.abs(length - 1) > tolerance).length;
  return (
    `Length between ${Math.min(...lengths).toFixed(5)} and ${Math.max(...lengths).toFixed(5)}; ` +
    `${plural(beyond(tolerances.unitWarning), 'key')} beyond the warning tolerance of ${tolerances.unitWarning}, ` +
    `${beyond(tolerances.unitError)} beyond the error tolerance of ${tolerances.unitError}.`
  );
}

/** "Fastest 850.0°/s at 1.250 s; the policy allows 1440°/s; 0 segments above it." */
export function describeSpeed(series: KeySeries, maxSpeedDegreesPerSecond: number): string {
  let fastest = -1;
  let fastestSegment = -1;
  let above = 0;
  series.speedDegreesPerSecond.forEach((speed, segment) => {
    if (speed === null || !Number.isFinite(speed)) return;
    if (speed > fastest) [fastest, fastestSegment] = [speed, segment];
    if (speed > maxSpeedDegreesPerSecond) above++;
  });
  if (fastestSegment < 0) return 'No segment between keys has a measurable speed.';
  return (
    `Fastest ${fastest.toFixed(1)}°/s from ${timeText(series.times[fastestSegment])}; ` +
    `the policy allows ${maxSpeedDegreesPerSecond}°/s; ${plural(above, 'segment')} above it.`
  );
}

function timeText(seconds: number | undefined): string {
  return seconds === undefined ? '—' : `${seconds.toFixed(3)} s`;
}

/**
 * A duration in milliseconds as a short human string: `850 ms`, `1.2 s`, `14 s`, `2 min 05 s`, `1 h 03 min`.
 * Used for lint and upload times in tables, where the reader compares magnitudes at a glance; precision falls as the
 * value grows because nobody compares a 40-minute build to the second.
 */
export function formatDuration(durationMs: number): string {
  if (!Number.isFinite(durationMs) || durationMs < 0) return '—';
  if (durationMs < 1000) return `${Math.round(durationMs)} ms`;
  const totalSeconds = durationMs / 1000;
  if (totalSeconds < 10) return `${trimZero(totalSeconds.toFixed(1))} s`;
  if (totalSeconds < 60) return `${Math.round(totalSeconds)} s`;
  const roundedSeconds = Math.round(totalSeconds);
  if (roundedSeconds < 3600) {
    const minutes = Math.floor(roundedSeconds / 60);
    const seconds = roundedSeconds % 60;
    return `${minutes} min ${pad2(seconds)} s`;
  }
  const roundedMinutes = Math.round(totalSeconds / 60);
  const hours = Math.floor(roundedMinutes / 60);
  const minutes = roundedMinutes % 60;
  return `${hours} h ${pad2(minutes)} min`;
}

function pad2(value: number): string {
  return String(value).padStart(2, '0');
}

function trimZero(text: string): string {
  return text.endsWith('.0') ? text.slice(0, -2) : text;
}

/**
 * A time to fix as people say it: `40 min`, `5 h 20 min`, `3 d 4 h`. Fixes take hours to weeks,
 * so minutes matter only within the first day and hours only within the first weeks.
 *
 * @example formatTimeToFix(3 * 86_400_000 + 4 * 3_600_000) → '3 d 4 h'
 */
export function formatTimeToFix(durationMs: number): string {
  if (!Number.isFinite(durationMs) || durationMs < 0) return '—';
  const minutes = Math.round(durationMs / 60_000);
  if (minutes < 60) return `${Math.max(minutes, 1)} min`;
  const hours = Math.floor(minutes / 60);
  if (hours < 24) return minutes % 60 === 0 ? `${hours} h` : `${hours} h ${minutes % 60} min`;
  const days = Math.floor(hours / 24);
  if (days >= 14 || hours % 24 === 0) return `${days} d`;
  return `${days} d ${hours % 24} h`;
}

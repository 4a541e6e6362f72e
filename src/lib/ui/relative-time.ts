import { cachedDateFormat } from './cached-date-format';

/**
 * How long ago a moment was, in a few calm words: `just now`, `4 min ago`, `3 h ago`, `yesterday`, `5 days ago`,
 * then a date (`12 Mar`, or `12 Mar 2024` in another year). Used beside build times; always pair it with the absolute
 * time (see `formatAbsoluteTime`) in a `title` or `<time datetime>` so nothing is lost.
 *
 * Moments slightly in the future (a server clock ahead of the browser) read as `just now` rather than "in 20 s".
 */
export function relativeTime(moment: Date | string, now: Date, options: RelativeTimeOptions = {}): string {
  const date = typeof moment === 'string' ? new Date(moment) : moment;
  const elapsedMs = now.getTime() - date.getTime();
  if (Number.isNaN(elapsedMs)) return '—';
  if (elapsedMs < -FUTURE_TOLERANCE_MS) return `in ${spanText(-elapsedMs)}`;
  if (elapsedMs < MINUTE_MS) return 'just now';
  if (elapsedMs < DAY_MS) return `${spanText(elapsedMs)} ago`;
  const elapsedDays = Math.floor(elapsedMs / DAY_MS);
  if (elapsedDays === 1) return 'yesterday';
  if (elapsedDays < 7) return `${elapsedDays} days ago`;
  const sameYear = yearIn(date, options.timeZone) === yearIn(now, options.timeZone);
  return cachedDateFormat('en-GB', {
    day: 'numeric',
    month: 'short',
    year: sameYear ? undefined : 'numeric',
    timeZone: options.timeZone
  }).format(date);
}

/** Options for {@link relativeTime}. */
export interface RelativeTimeOptions {
  /** IANA zone for the date fallback; the viewer's own zone when omitted. */
  timeZone?: string;
}

const MINUTE_MS = 60_000;
const HOUR_MS = 60 * MINUTE_MS;
const DAY_MS = 24 * HOUR_MS;
const FUTURE_TOLERANCE_MS = 2 * MINUTE_MS;

function spanText(spanMs: number): string {
  if (spanMs < HOUR_MS) return `${Math.max(1, Math.floor(spanMs / MINUTE_MS))} min`;
  if (spanMs < DAY_MS) return `${Math.floor(spanMs / HOUR_MS)} h`;
  const days = Math.floor(spanMs / DAY_MS);
  return days === 1 ? '1 day' : `${days} days`;
}

function yearIn(date: Date, timeZone: string | undefined): string {
  return cachedDateFormat('en-GB', { year: 'numeric', timeZone }).format(date);
}

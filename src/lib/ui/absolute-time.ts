import { cachedDateFormat } from './cached-date-format';

/**
 * A moment as an unambiguous date and time with its zone: `Wed 12 Mar 2025, 14:05 UTC`.
 * Goes in `title` attributes and detail panes next to {@link relativeTime}-style text, so a lead can match a build to
 * a CI log line. Day-month order and a 24-hour clock avoid the 03/12 question.
 */
export function formatAbsoluteTime(moment: Date | string, options: AbsoluteTimeOptions = {}): string {
  const date = typeof moment === 'string' ? new Date(moment) : moment;
  if (Number.isNaN(date.getTime())) return '—';
  const parts = cachedDateFormat('en-GB', {
    weekday: 'short',
    day: 'numeric',
    month: 'short',
    year: 'numeric',
    hour: '2-digit',
    minute: '2-digit',
    hourCycle: 'h23',
    timeZoneName: 'short',
    timeZone: options.timeZone
  }).formatToParts(date);
  const part = (type: Intl.DateTimeFormatPartTypes) => parts.find((entry) => entry.type === type)?.value ?? '';
  return `${part('weekday')} ${part('day')} ${part('month')} ${part('year')}, ${part('hour')}:${part('minute')} ${part('timeZoneName')}`;
}

/** Options for {@link formatAbsoluteTime}. */
export interface AbsoluteTimeOptions {
  /** IANA zone; the viewer's own zone when omitted. */
  timeZone?: string;
}

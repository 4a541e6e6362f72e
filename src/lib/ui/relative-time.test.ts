import { describe, expect, it } from 'vitest';
import { relativeTime } from './relative-time';

const now = new Date('2025-03-12T14:00:00Z');
const ago = (ms: number) => new Date(now.getTime() - ms);
const MINUTE = 60_000;
const HOUR = 60 * MINUTE;
const DAY = 24 * HOUR;

describe('relativeTime', () => {
  // Expected words are our own display convention; dates use the en-GB day-month order (ECMA-402 Intl.DateTimeFormat).
  it.each([
    { label: '10 seconds', moment: ago(10_000), expected: 'just now' },
    { label: '59 seconds', moment: ago(59_000), expected: 'just now' },
    { label: '1 minute', moment: ago(MINUTE), expected: '1 min ago' },
    { label: '59 minutes', moment: ago(59 * MINUTE + 59_000), expected: '59 min ago' },
    { label: '1 hour', moment: ago(HOUR), expected: '1 h ago' },
    { label: '23 hours', moment: ago(23 * HOUR + 59 * MINUTE), expected: '23 h ago' },
    { label: '1 day', moment: ago(DAY + HOUR), expected: 'yesterday' },
    { label: '6 days', moment: ago(6 * DAY), expected: '6 days ago' },
    { label: '8 days', moment: ago(8 * DAY), expected: '4 Mar' },
    { label: 'last year', moment: new Date('2024-11-30T09:00:00Z'), expected: '30 Nov 2024' }
  ])('describes a moment $label before now as "$expected"', ({ moment, expected }) => {
    expect(relativeTime(moment, now, { timeZone: 'UTC' })).toBe(expected);
  });

  it('accepts ISO strings as sent by the server', () => {
    expect(relativeTime('2025-03-12T13:30:00.000Z', now)).toBe('30 min ago');
  });

  it('treats a moment up to two minutes in the future as "just now" to absorb clock skew', () => {
    expect(relativeTime(new Date(now.getTime() + 90_000), now)).toBe('just now');
  });

  it('says "in" for moments clearly in the future', () => {
    expect(relativeTime(new Date(now.getTime() + 3 * HOUR), now)).toBe('in 3 h');
  });

  it('uses the given time zone to decide the year of the date fallback', () => {
    // 31 Dec 2024 23:30 UTC is already 1 Jan 2025 in Tokyo (UTC+9, no DST).
    const newYearsEve = new Date('2024-12-31T23:30:00Z');
    const later = new Date('2025-01-20T00:00:00Z');
    expect(relativeTime(newYearsEve, later, { timeZone: 'UTC' })).toBe('31 Dec 2024');
    expect(relativeTime(newYearsEve, later, { timeZone: 'Asia/Tokyo' })).toBe('1 Jan');
  });

  it('shows a dash for an unreadable date', () => {
    expect(relativeTime('not a date', now)).toBe('—');
  });
});

import { describe, expect, it } from 'vitest';
import { formatAbsoluteTime } from './absolute-time';

describe('formatAbsoluteTime', () => {
  it('writes weekday, day, month, year, 24-hour time and zone', () => {
    // 12 March 2025 was a Wednesday (ISO 8601 calendar).
    expect(formatAbsoluteTime('2025-03-12T14:05:09Z', { timeZone: 'UTC' })).toBe('Wed 12 Mar 2025, 14:05 UTC');
  });

  it('uses a 24-hour clock past noon and midnight', () => {
    expect(formatAbsoluteTime(new Date('2025-03-12T00:07:00Z'), { timeZone: 'UTC' })).toBe(
      'Wed 12 Mar 2025, 00:07 UTC'
    );
    expect(formatAbsoluteTime(new Date('2025-03-12T23:59:00Z'), { timeZone: 'UTC' })).toBe(
      'Wed 12 Mar 2025, 23:59 UTC'
    );
  });

  it('shifts into the requested zone', () => {
    // Asia/Tokyo is UTC+9 with no daylight saving time (IANA tz database).
    expect(formatAbsoluteTime('2025-03-12T20:00:00Z', { timeZone: 'Asia/Tokyo' })).toMatch(
      /^Thu 13 Mar 2025, 05:00 (GMT\+9|JST)$/
    );
  });

  it('shows a dash for an unreadable date', () => {
    expect(formatAbsoluteTime('soon')).toBe('—');
  });
});

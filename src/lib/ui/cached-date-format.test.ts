import { describe, expect, it } from 'vitest';
import { cachedDateFormat } from './cached-date-format';

describe('cachedDateFormat', () => {
  const moment = new Date(Date.UTC(2026, 2, 12, 14, 5));

  it('formats as a freshly built Intl.DateTimeFormat does', () => {
    const options: Intl.DateTimeFormatOptions = { day: 'numeric', month: 'short', timeZone: 'Asia/Tokyo' };
    expect(cachedDateFormat('en-GB', options).format(moment)).toBe(
      new Intl.DateTimeFormat('en-GB', options).format(moment)
    );
  });

  it('builds each locale and options once, and keeps zones apart', () => {
    const utc = cachedDateFormat('en-GB', { hour: '2-digit', timeZone: 'UTC' });
    expect(cachedDateFormat('en-GB', { hour: '2-digit', timeZone: 'UTC' })).toBe(utc);
    const tokyo = cachedDateFormat('en-GB', { hour: '2-digit', timeZone: 'Asia/Tokyo' });
    expect(tokyo).not.toBe(utc);
    expect([utc.format(moment), tokyo.format(moment)]).toEqual(['14', '23']);
  });

  it('throws the constructor’s RangeError for an unknown zone', () => {
    expect(() => cachedDateFormat('en-GB', { timeZone: 'Harbour/Nowhere' })).toThrow(RangeError);
  });
});

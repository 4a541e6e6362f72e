/**
 * The trends page's range and branch as they sit in the URL (`?branch=&from=&to=`): dates are
 * calendar days (YYYY-MM-DD, UTC), `to` empty means "up to now", and presets are the last 7, 30
 * or 90 days. Pure, so the server load and the page compute the same thing.
 */

/** A trend range: branch plus first and last day (last empty: up to now). */
export interface TrendRange {
  branch: string;
  from: string;
  to: string;
}

/** The preset ranges, in days, offered as buttons. */
export const RANGE_PRESETS_DAYS = [7, 30, 90] as const;

/** The range a page opens with. */
export const DEFAULT_RANGE_DAYS = 30;

/** The calendar day (UTC) `days - 1` days before `today`, so a preset of 7 covers 7 days including today. */
export function presetFrom(days: number, today: Date = new Date()): string {
  return dayOf(new Date(today.getTime() - (days - 1) * 86_400_000));
}

/** Which preset a range matches, or null for a custom one. */
export function presetOf(range: Pick<TrendRange, 'from' | 'to'>, today: Date = new Date()): number | null {
  if (range.to !== '' && range.to !== dayOf(today)) return null;
  return RANGE_PRESETS_DAYS.find((days) => presetFrom(days, today) === range.from) ?? null;
}

/** The URL query of a range; the base branch and an open end are left out so links stay short. */
export function rangeSearch(range: TrendRange, baseBranch: string): string {
  const params = new URLSearchParams();
  if (range.branch && range.branch !== baseBranch) params.set('branch', range.branch);
  if (range.from) params.set('from', range.from);
  if (range.to) params.set('to', range.to);
  const text = params.toString();
  return text ? `?${text}` : '';
}

/** A moment's calendar day in UTC. */
export function dayOf(moment: Date): string {
  return moment.toISOString().slice(0, 10);
}

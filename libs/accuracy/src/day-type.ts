/**
 * Day types accuracy is broken down by: working weekdays, weekends (Saturday and Sunday) and the days
 * of the organisation's holiday calendar, the split load forecasters use because load shapes differ
 * between them (common practice; see Hong & Fan 2016, Int. J. Forecasting 32(3), §3).
 */

/** Kind of local day. */
export type DayType = 'weekday' | 'weekend' | 'holiday';

/** Every day type, in the order screens list them. */
export const dayTypes: readonly DayType[] = ['weekday', 'weekend', 'holiday'];

/** The day type of a local calendar date (YYYY-MM-DD); a holiday wins over a weekend. */
export function dayTypeOf(localDate: string, holidays: ReadonlySet<string>): DayType {
  if (holidays.has(localDate)) return 'holiday';
  // The weekday of a calendar date does not depend on the zone: read it at UTC noon.
  const weekday = new Date(`${localDate}T12:00:00Z`).getUTCDay();
  return weekday === 0 || weekday === 6 ? 'weekend' : 'weekday';
}

import type { LocalCalendar } from './local-calendar';

/**
 * Day type of a local date: 'weekday' (Monday–Friday), 'saturday', or 'sunday-holiday' (Sunday or any
 * holiday, since load on holidays resembles Sunday load: common practice in load forecasting).
 */
export type DayType = 'weekday' | 'saturday' | 'sunday-holiday';

/** The day type of every observation; `holidays` may be null (no holiday calendar). */
export function dayTypes(calendar: LocalCalendar, holidays: ReadonlySet<string> | null): DayType[] {
  return calendar.localDate.map((date, i) => {
    if (calendar.dayOfWeek[i] === 6 || holidays?.has(date)) return 'sunday-holiday';
    return calendar.dayOfWeek[i] === 5 ? 'saturday' : 'weekday';
  });
}

/** 0/1 regressor columns for Saturday and Sunday-or-holiday (weekday is the baseline). */
export function dayTypeIndicators(
  calendar: LocalCalendar,
  holidays: ReadonlySet<string> | null,
): { saturday: Float64Array; sundayHoliday: Float64Array } {
  const types = dayTypes(calendar, holidays);
  return {
    saturday: Float64Array.from(types, (t) => (t === 'saturday' ? 1 : 0)),
    sundayHoliday: Float64Array.from(types, (t) => (t === 'sunday-holiday' ? 1 : 0)),
  };
}

/** 0/1 regressor column: the observation's local date is a holiday. */
export function holidayIndicator(calendar: LocalCalendar, holidays: ReadonlySet<string>): Float64Array {
  return Float64Array.from(calendar.localDate, (date) => (holidays.has(date) ? 1 : 0));
}

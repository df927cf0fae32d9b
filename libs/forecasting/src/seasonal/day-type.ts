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
  // The same rule as dayTypes, written straight into the columns (this runs for every fit and forecast).
  const n = calendar.localDate.length;
  const saturday = new Float64Array(n);
  const sundayHoliday = new Float64Array(n);
  const isHoliday = holidays ? holidayTest(holidays) : () => false;
  for (let i = 0; i < n; i++) {
    if (calendar.dayOfWeek[i] === 6 || isHoliday(calendar.localDate[i])) sundayHoliday[i] = 1;
    else if (calendar.dayOfWeek[i] === 5) saturday[i] = 1;
  }
  return { saturday, sundayHoliday };
}

/** 0/1 regressor column: the observation's local date is a holiday. */
export function holidayIndicator(calendar: LocalCalendar, holidays: ReadonlySet<string>): Float64Array {
  const isHoliday = holidayTest(holidays);
  return Float64Array.from(calendar.localDate, (date) => (isHoliday(date) ? 1 : 0));
}

/** holidays.has, remembering the last date asked: hourly dates come 24 in a row, so the set is asked once a day. */
function holidayTest(holidays: ReadonlySet<string>): (date: string) => boolean {
  let last: string | null = null;
  let answer = false;
  return (date) => {
    if (date !== last) {
      last = date;
      answer = holidays.has(date);
    }
    return answer;
  };
}

import { ForecastingError, assertFinite } from '../core/errors';

/** Local wall-clock position of each hourly timestamp in the series' own time zone. */
export interface LocalCalendar {
  /** Local hour 0..23. */
  hourOfDay: Uint8Array;
  /** ISO weekday 0..6 with Monday = 0 (ISO 8601 weeks start on Monday). */
  dayOfWeek: Uint8Array;
  /** dayOfWeek * 24 + hourOfDay, 0..167 (Monday 00:00 = 0). */
  hourOfWeek: Uint16Array;
  /** Local calendar date as YYYY-MM-DD (for day types and holidays). */
  localDate: string[];
  /** The IANA zone it was made in. */
  timeZone: string;
}

const formatters = new Map<string, Intl.DateTimeFormat>();

/** One cached formatter per zone; building Intl.DateTimeFormat is the slow part. */
function formatterFor(timeZone: string): Intl.DateTimeFormat {
  let formatter = formatters.get(timeZone);
  if (!formatter) {
    try {
      formatter = new Intl.DateTimeFormat('en-US', {
        timeZone,
        hourCycle: 'h23',
        year: 'numeric',
        month: '2-digit',
        day: '2-digit',
        hour: '2-digit',
        minute: '2-digit',
      });
    } catch {
      throw new ForecastingError('invalid-argument', 'localCalendar', `unknown IANA time zone "${timeZone}" (e.g. "America/Chicago")`);
    }
    formatters.set(timeZone, formatter);
  }
  return formatter;
}

/**
 * Maps UTC epoch-millisecond timestamps to local hour, ISO weekday, hour-of-week slot and date in an
 * IANA time zone (Intl with the platform's tz database).
 *
 * Daylight saving, by wall clock: on the spring-forward day the skipped local hour (02:00 in
 * America/Chicago) gets no observation, so that day fills 23 slots; on the fall-back day the repeated
 * local hour (01:00 CDT and 01:00 CST) maps both observations to the same slot (hour 1), so that slot
 * holds two observations. Zones without DST (America/Phoenix, Asia/Kolkata) always have 24 hours a day.
 * Minutes are ignored: in zones with half-hour offsets (Asia/Kolkata, UTC+05:30) an observation stamped
 * 10:00 UTC falls in local 15:30 and takes slot hour 15.
 *
 * @throws ForecastingError 'invalid-argument' for an unknown zone, 'non-finite-input' for bad timestamps.
 */
export function localCalendar(timestamps: ArrayLike<number>, timeZone: string): LocalCalendar {
  assertFinite('localCalendar', timestamps, 'timestamps');
  const offsetAt = offsetFinder(timeZone);
  const n = timestamps.length;
  const hourOfDay = new Uint8Array(n);
  const dayOfWeek = new Uint8Array(n);
  const hourOfWeek = new Uint16Array(n);
  const localDate = new Array<string>(n);
  const dates = new Map<number, string>();
  // Hourly series pass through each local day 24 hours in a row: the last day's date string is kept at hand.
  let lastDays = Number.NaN;
  let lastDate = '';
  for (let i = 0; i < n; i++) {
    const local = timestamps[i] + offsetAt(timestamps[i]);
    const days = Math.floor(local / dayMs);
    const hour = Math.floor((local - days * dayMs) / hourMs);
    // 1970-01-01 was a Thursday, ISO weekday 3 with Monday = 0.
    const weekday = (((days + 3) % 7) + 7) % 7;
    let date = days === lastDays ? lastDate : dates.get(days);
    if (date === undefined) {
      date = new Date(days * dayMs).toISOString().slice(0, 10);
      dates.set(days, date);
    }
    lastDays = days;
    lastDate = date;
    hourOfDay[i] = hour;
    dayOfWeek[i] = weekday;
    hourOfWeek[i] = weekday * 24 + hour;
    localDate[i] = date;
  }
  return { hourOfDay, dayOfWeek, hourOfWeek, localDate, timeZone };
}

/**
 * The calendar of `data`'s timestamps from hour `from` on, in `timeZone`: sliced from the one it carries when that
 * is for this zone and length (a refit fits, extends and forecasts from the same hours many times, and computing
 * the calendar is not free), else computed for those hours only.
 */
export function calendarOf(data: { timestamps: Float64Array; calendar?: LocalCalendar }, timeZone: string, from = 0): LocalCalendar {
  const n = data.timestamps.length;
  const carried = data.calendar;
  if (carried && carried.timeZone === timeZone && carried.hourOfDay.length === n)
    return from === 0 ? carried : sliceCalendar(carried, from, n);
  return localCalendar(from === 0 ? data.timestamps : data.timestamps.subarray(from), timeZone);
}

/** Hours start … end − 1 of a calendar (typed arrays shared, not copied). */
export function sliceCalendar(calendar: LocalCalendar, start: number, end: number): LocalCalendar {
  return {
    hourOfDay: calendar.hourOfDay.subarray(start, end),
    dayOfWeek: calendar.dayOfWeek.subarray(start, end),
    hourOfWeek: calendar.hourOfWeek.subarray(start, end),
    localDate: calendar.localDate.slice(start, end),
    timeZone: calendar.timeZone,
  };
}

const minuteMs = 60_000;
const hourMs = 3_600_000;
const dayMs = 86_400_000;

/**
 * Each zone's steady offset (or null: a clock change that day) by UTC day, kept across calls: a refit asks
 * for the calendar of the same days many times (estimation, every backtest origin, the forecast), and the
 * tz database does not change while the process runs. Emptied past MAX_CACHED_DAYS days per zone.
 */
const steadyOffsets = new Map<string, Map<number, number | null>>();
/** About 270 years of days per zone: far more than any worker sees, small in memory. */
const MAX_CACHED_DAYS = 100_000;

/**
 * The zone's UTC offset at an instant, asking Intl (the slow part) about twice per UTC day: when the
 * offsets at a day's first and last minute agree, no clock change falls inside it (zones change at
 * most once a day), and every instant of the day shares that offset.
 */
function offsetFinder(timeZone: string): (t: number) => number {
  const formatter = formatterFor(timeZone);
  const exact = (t: number): number => {
    let year = 0;
    let month = 0;
    let day = 0;
    let hour = 0;
    let minute = 0;
    for (const part of formatter.formatToParts(t)) {
      if (part.type === 'year') year = Number(part.value);
      else if (part.type === 'month') month = Number(part.value);
      else if (part.type === 'day') day = Number(part.value);
      else if (part.type === 'hour') hour = Number(part.value);
      else if (part.type === 'minute') minute = Number(part.value);
    }
    return Date.UTC(year, month - 1, day, hour, minute) - Math.floor(t / minuteMs) * minuteMs;
  };
  let steadyByDay = steadyOffsets.get(timeZone);
  if (!steadyByDay || steadyByDay.size > MAX_CACHED_DAYS) {
    steadyByDay = new Map<number, number | null>();
    steadyOffsets.set(timeZone, steadyByDay);
  }
  const days = steadyByDay;
  // Consecutive instants mostly share a UTC day: its offset is kept at hand before asking the map.
  let lastDay = Number.NaN;
  let lastSteady: number | null = null;
  return (t) => {
    const utcDay = Math.floor(t / dayMs);
    if (utcDay !== lastDay) {
      let steady = days.get(utcDay);
      if (steady === undefined) {
        const first = exact(utcDay * dayMs);
        steady = first === exact(utcDay * dayMs + dayMs - minuteMs) ? first : null;
        days.set(utcDay, steady);
      }
      lastDay = utcDay;
      lastSteady = steady;
    }
    return lastSteady ?? exact(t);
  };
}

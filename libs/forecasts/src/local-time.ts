/**
 * Wall-clock reckoning in an IANA time zone through the runtime's Intl data: the local date and time
 * of an instant, the UTC offset in force, and how long a local day is (23, 24 or 25 hours around
 * daylight-saving changes).
 */

/** An instant as a clock on the wall of `timeZone` shows it. */
export interface LocalClock {
  /** Local calendar date, YYYY-MM-DD. */
  date: string;
  /** Local time, HH:mm:ss (24-hour). */
  time: string;
  /** Minutes east of UTC in force at the instant (-300 for UTC−05:00). */
  offsetMinutes: number;
}

const formatters = new Map<string, Intl.DateTimeFormat>();

/** One cached formatter per zone: building them is far dearer than using them. */
function formatterFor(timeZone: string): Intl.DateTimeFormat {
  let formatter = formatters.get(timeZone);
  if (!formatter) {
    formatter = new Intl.DateTimeFormat('en-US', {
      timeZone,
      hourCycle: 'h23',
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      minute: '2-digit',
      second: '2-digit',
    });
    formatters.set(timeZone, formatter);
  }
  return formatter;
}

/** The local date, time and offset of `instant` (a Date or epoch milliseconds) in `timeZone`. */
export function localClock(instant: Date | number, timeZone: string): LocalClock {
  const ms = typeof instant === 'number' ? instant : instant.getTime();
  const parts: Record<string, string> = {};
  for (const part of formatterFor(timeZone).formatToParts(ms)) parts[part.type] = part.value;
  const year = Number(parts['year']);
  const month = Number(parts['month']);
  const day = Number(parts['day']);
  const hour = Number(parts['hour']);
  const minute = Number(parts['minute']);
  const second = Number(parts['second']);
  const wallAsUtc = Date.UTC(year, month - 1, day, hour, minute, second);
  const offsetMinutes = Math.round((wallAsUtc - Math.floor(ms / 1000) * 1000) / 60_000);
  return {
    date: `${parts['year']}-${parts['month']}-${parts['day']}`,
    time: `${parts['hour']}:${parts['minute']}:${parts['second']}`,
    offsetMinutes,
  };
}

/** An offset in minutes as ISO 8601 `±HH:MM`. */
export function formatOffset(offsetMinutes: number): string {
  const sign = offsetMinutes < 0 ? '-' : '+';
  const absolute = Math.abs(offsetMinutes);
  return `${sign}${String(Math.floor(absolute / 60)).padStart(2, '0')}:${String(absolute % 60).padStart(2, '0')}`;
}

/**
 * `instant` as ISO 8601 local time with the offset in force, e.g. 2026-11-01T01:00:00-06:00; in UTC
 * it ends in Z. The offset makes the repeated hour of a fall-back day unambiguous.
 */
export function localIso(instant: Date | number, timeZone: string): string {
  const clock = localClock(instant, timeZone);
  const suffix = timeZone === 'UTC' || timeZone === 'Etc/UTC' ? 'Z' : formatOffset(clock.offsetMinutes);
  return `${clock.date}T${clock.time}${suffix}`;
}

/** The instant (epoch ms) at which local day `date` (YYYY-MM-DD) begins in `timeZone`. */
export function startOfLocalDay(date: string, timeZone: string): number {
  const [year, month, day] = date.split('-').map(Number) as [number, number, number];
  const midnightAsUtc = Date.UTC(year, month - 1, day);
  // Guess with the offset at UTC midnight, then correct with the offset in force at the guess: two
  // rounds settle every zone whose offset changes at most once within a day.
  let guess = midnightAsUtc - localClock(midnightAsUtc, timeZone).offsetMinutes * 60_000;
  guess = midnightAsUtc - localClock(guess, timeZone).offsetMinutes * 60_000;
  return guess;
}

/** The calendar date after `date` (YYYY-MM-DD). */
export function nextDate(date: string): string {
  const [year, month, day] = date.split('-').map(Number) as [number, number, number];
  return new Date(Date.UTC(year, month - 1, day + 1)).toISOString().slice(0, 10);
}

/** How many intervals of `intervalMinutes` local day `date` holds: 24 hourly ones, 23 or 25 on a DST change day. */
export function intervalsInLocalDay(date: string, timeZone: string, intervalMinutes: number): number {
  const length = startOfLocalDay(nextDate(date), timeZone) - startOfLocalDay(date, timeZone);
  return Math.round(length / (intervalMinutes * 60_000));
}

import { TZDate } from '@date-fns/tz';

/** Pattern of a `datetime-local` input's value. */
const localPattern = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})$/;

/**
 * The UTC instant (ISO) of a wall-clock time `YYYY-MM-DDTHH:mm` in an IANA time zone, or null when the
 * text is not such a time. In a fall-back hour the earlier instant is taken; in a spring-forward gap
 * the time moves on by the missing hour, as the clocks did.
 */
export function instantOfLocal(local: string, timeZone: string): string | null {
  const match = localPattern.exec(local);
  if (!match) return null;
  const [, year, month, day, hour, minute] = match.map(Number) as [number, number, number, number, number, number];
  const date = new TZDate(year, month - 1, day, hour, minute, timeZone);
  return Number.isNaN(date.getTime()) ? null : new Date(date.getTime()).toISOString();
}

/** The wall-clock time `YYYY-MM-DDTHH:mm` of an instant in an IANA time zone, for `datetime-local` inputs. */
export function localOfInstant(iso: string, timeZone: string): string {
  const parts = Object.fromEntries(
    new Intl.DateTimeFormat('en-GB', {
      timeZone,
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      minute: '2-digit',
      hourCycle: 'h23',
    })
      .formatToParts(new Date(iso))
      .map((part) => [part.type, part.value]),
  );
  return `${parts['year']}-${parts['month']}-${parts['day']}T${parts['hour']}:${parts['minute']}`;
}

/** "Tue 2 Dec 17:00 CST": an instant as a planner reads it in the series' time zone, zone named. */
export function zonedClock(iso: string, timeZone: string): string {
  return new Intl.DateTimeFormat('en-US', {
    timeZone,
    weekday: 'short',
    day: 'numeric',
    month: 'short',
    hour: '2-digit',
    minute: '2-digit',
    hourCycle: 'h23',
    timeZoneName: 'short',
  })
    .format(new Date(iso))
    .replace(/,/g, '');
}

/** The short name of a time zone at an instant, e.g. "CST" or "GMT-6". */
export function zoneAbbreviation(iso: string, timeZone: string): string {
  return (
    new Intl.DateTimeFormat('en-US', { timeZone, timeZoneName: 'short' })
      .formatToParts(new Date(iso))
      .find((part) => part.type === 'timeZoneName')?.value ?? timeZone
  );
}

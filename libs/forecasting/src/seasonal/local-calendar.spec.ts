import { describe, expect, it } from 'vitest';
import { ForecastingError } from '../core/errors';
import { calendarOf, localCalendar, sliceCalendar } from './local-calendar';

const HOUR = 3_600_000;
/** Hourly UTC timestamps from an ISO instant. */
const hourly = (startIso: string, count: number) => Float64Array.from({ length: count }, (_, i) => Date.parse(startIso) + i * HOUR);

// DST facts (common knowledge, US Energy Policy Act of 2005): in 2024 US clocks sprang forward on Sunday
// 10 March at 02:00 local and fell back on Sunday 3 November at 02:00 local. Chicago is UTC−6 (CST) /
// UTC−5 (CDT); Phoenix stays on UTC−7 all year; Kolkata is UTC+05:30 all year.
describe('localCalendar', () => {
  it('skips the missing hour on the spring-forward day in America/Chicago', () => {
    // 06:00Z = 00:00 CST on 10 March; 08:00Z is already 03:00 CDT.
    const cal = localCalendar(hourly('2024-03-10T06:00:00Z', 24), 'America/Chicago');
    expect(Array.from(cal.hourOfDay.slice(0, 4))).toEqual([0, 1, 3, 4]);
    expect(cal.localDate.filter((d) => d === '2024-03-10')).toHaveLength(23);
    expect(cal.hourOfDay.includes(2, 0)).toBe(false);
    expect(cal.dayOfWeek[0]).toBe(6); // Sunday with Monday = 0
    expect(cal.hourOfWeek[2]).toBe(6 * 24 + 3);
    expect(cal.localDate[23]).toBe('2024-03-11');
    expect(cal.hourOfWeek[23]).toBe(0); // Monday 00:00 CDT starts the week
  });

  it('maps both repeated hours on the fall-back day in America/Chicago to slot hour 1', () => {
    // 05:00Z = 00:00 CDT; 06:00Z = 01:00 CDT; 07:00Z = 01:00 CST; 08:00Z = 02:00 CST.
    const cal = localCalendar(hourly('2024-11-03T05:00:00Z', 26), 'America/Chicago');
    expect(Array.from(cal.hourOfDay.slice(0, 4))).toEqual([0, 1, 1, 2]);
    expect(cal.localDate.filter((d) => d === '2024-11-03')).toHaveLength(25);
    expect(cal.hourOfWeek[1]).toBe(cal.hourOfWeek[2]);
    expect(cal.hourOfWeek[1]).toBe(6 * 24 + 1);
  });

  it('keeps 24 hours on the same dates in zones without daylight saving', () => {
    const phoenix = localCalendar(hourly('2024-03-10T07:00:00Z', 24), 'America/Phoenix');
    expect(Array.from(phoenix.hourOfDay)).toEqual(Array.from({ length: 24 }, (_, h) => h));
    expect(new Set(phoenix.localDate)).toEqual(new Set(['2024-03-10']));
    const fallPhoenix = localCalendar(hourly('2024-11-03T07:00:00Z', 24), 'America/Phoenix');
    expect(Array.from(fallPhoenix.hourOfDay)).toEqual(Array.from({ length: 24 }, (_, h) => h));
    // 18:30Z on 9 March = 00:00 IST on 10 March; whole-hour UTC stamps fall at hh:30 local, slot = hh.
    const kolkata = localCalendar(hourly('2024-03-09T18:30:00Z', 24), 'Asia/Kolkata');
    expect(Array.from(kolkata.hourOfDay)).toEqual(Array.from({ length: 24 }, (_, h) => h));
    expect(kolkata.localDate[0]).toBe('2024-03-10');
    const kolkataWhole = localCalendar(hourly('2024-03-10T00:00:00Z', 1), 'Asia/Kolkata');
    expect(kolkataWhole.hourOfDay[0]).toBe(5);
  });

  it('refuses an unknown zone', () => {
    expect(() => localCalendar([0], 'Mars/Olympus')).toThrow(ForecastingError);
  });
});

describe('calendarOf', () => {
  const start = Date.UTC(2026, 2, 7, 0); // the week of the spring-forward night in America/Chicago
  const timestamps = Float64Array.from({ length: 48 * 4 }, (_, i) => start + i * 3_600_000);

  it('uses a carried calendar only when it was made in the same zone for the same hours', () => {
    const chicago = localCalendar(timestamps, 'America/Chicago');
    expect(calendarOf({ timestamps, calendar: chicago }, 'America/Chicago')).toBe(chicago);
    const elsewhere = calendarOf({ timestamps, calendar: chicago }, 'Europe/Berlin');
    expect(elsewhere).not.toBe(chicago);
    expect(elsewhere).toEqual(localCalendar(timestamps, 'Europe/Berlin'));
    const shorter = calendarOf({ timestamps: timestamps.subarray(0, 24), calendar: chicago }, 'America/Chicago');
    expect(shorter).toEqual(localCalendar(timestamps.subarray(0, 24), 'America/Chicago'));
  });

  it('slices to the calendar of the sliced hours', () => {
    const whole = localCalendar(timestamps, 'America/Chicago');
    expect(sliceCalendar(whole, 30, 90)).toEqual(localCalendar(timestamps.subarray(30, 90), 'America/Chicago'));
  });
});

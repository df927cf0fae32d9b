import { describe, expect, it } from 'vitest';
import { ForecastingError } from '../core/errors';
import { dayTypes, holidayIndicator } from './day-type';
import { holidayDates, yearsOf } from './holiday-calendar';
import { localCalendar } from './local-calendar';

// Holiday facts (common knowledge): US Independence Day 2024 fell on Thursday 4 July; Christmas 2022 was
// a Sunday and its observed federal holiday was Monday 26 December (5 U.S.C. 6103(b)).
describe('holidayDates', () => {
  it('reads public holidays from date-holidays and adds the editable extra dates', () => {
    const dates = holidayDates({ country: 'US', extraDates: ['2024-07-05'] }, [2022, 2024]);
    expect(dates.has('2024-07-04')).toBe(true);
    expect(dates.has('2022-12-26')).toBe(true);
    expect(dates.has('2024-07-05')).toBe(true);
    expect(dates.has('2024-02-14')).toBe(false); // an observance, not a public holiday
  });

  it('refuses unknown countries, regions and malformed dates', () => {
    expect(() => holidayDates({ country: 'XX', extraDates: [] }, [2024])).toThrow(ForecastingError);
    expect(() => holidayDates({ country: 'US', region: 'ZZ', extraDates: [] }, [2024])).toThrow(/region/);
    expect(() => holidayDates({ country: 'US', extraDates: ['4 July'] }, [2024])).toThrow(/YYYY-MM-DD/);
  });

  it('drops a public holiday the organisation removed, unless it is also listed as its own day', () => {
    // Independence Day 2024 is a US public holiday in date-holidays; excluded, it no longer counts.
    expect(holidayDates({ country: 'US', extraDates: [], excludedDates: ['2024-07-04'] }, [2024]).has('2024-07-04')).toBe(false);
    expect(holidayDates({ country: 'US', extraDates: ['2024-07-04'], excludedDates: ['2024-07-04'] }, [2024]).has('2024-07-04')).toBe(true);
  });
});

describe('day types', () => {
  it('classes weekdays, Saturdays and Sundays-or-holidays by local date', () => {
    // Noon local (17:00Z in CDT) from Wednesday 3 July to Sunday 7 July 2024.
    const ts = Float64Array.from({ length: 5 }, (_, d) => Date.parse('2024-07-03T17:00:00Z') + d * 86_400_000);
    const cal = localCalendar(ts, 'America/Chicago');
    const holidays = holidayDates({ country: 'US', extraDates: [] }, yearsOf(cal.localDate));
    expect(dayTypes(cal, holidays)).toEqual(['weekday', 'sunday-holiday', 'weekday', 'saturday', 'sunday-holiday']);
    expect(dayTypes(cal, null)[1]).toBe('weekday');
    expect(Array.from(holidayIndicator(cal, holidays))).toEqual([0, 1, 0, 0, 0]);
  });
});

import Holidays from 'date-holidays';
import { ForecastingError } from '../core/errors';

/** Where the holidays come from: a `date-holidays` country (and optional state/region) plus extra dates. */
export interface HolidaySpec {
  /** ISO 3166-1 alpha-2 country code, e.g. "US". */
  country: string;
  /** State/region code within the country as `date-holidays` names it, e.g. "TX". */
  region?: string;
  /** Extra local dates (YYYY-MM-DD) treated as holidays: plant shutdowns, bridge days, local events. */
  extraDates: string[];
  /** Public holidays of the package that do not count (removed from the organisation's calendar). */
  excludedDates?: string[];
}

const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/;

/**
 * The set of holiday dates (local YYYY-MM-DD) for the given years: the `date-holidays` entries of type
 * "public" (statutory days off, including observed substitute days) plus `extraDates`. Bank, school,
 * optional and observance days are left out because most load does not respond to them; add the ones that
 * matter to `extraDates`. Holidays starting in the afternoon keep their calendar date.
 *
 * @throws ForecastingError 'invalid-argument' for an unknown country or region or a malformed extra date.
 */
export function holidayDates(spec: HolidaySpec, years: Iterable<number>): Set<string> {
  const fn = 'holidayDates';
  const dates = new Set<string>();
  for (const year of years) for (const date of publicHolidays(fn, spec.country, spec.region, year)) dates.add(date);
  for (const extra of spec.extraDates) {
    if (!ISO_DATE.test(extra) || Number.isNaN(Date.parse(`${extra}T00:00:00Z`))) {
      throw new ForecastingError('invalid-argument', fn, `extra date "${extra}" is not a date in YYYY-MM-DD form`);
    }
    dates.add(extra);
  }
  for (const excluded of spec.excludedDates ?? []) if (!spec.extraDates.includes(excluded)) dates.delete(excluded);
  return dates;
}

// The package's rules never change within a process, and building its calendars is slow (a refit asks once per fit).
const publicHolidayCache = new Map<string, readonly string[]>();

/** The `date-holidays` public days of one country/region and year, computed once per process. */
function publicHolidays(fn: string, country: string, region: string | undefined, year: number): readonly string[] {
  const key = `${country}|${region ?? ''}|${year}`;
  const cached = publicHolidayCache.get(key);
  if (cached) return cached;
  const catalogue = new Holidays();
  const countries = catalogue.getCountries() ?? {};
  if (!(country in countries)) {
    throw new ForecastingError('invalid-argument', fn, `unknown country "${country}": use an ISO 3166-1 alpha-2 code such as "US"`);
  }
  if (region !== undefined) {
    const regions = catalogue.getStates(country) ?? {};
    if (!(region in regions)) {
      throw new ForecastingError(
        'invalid-argument',
        fn,
        `unknown region "${region}" for ${country}; known: ${Object.keys(regions).join(', ') || 'none'}`,
      );
    }
  }
  const calendar = region === undefined ? new Holidays(country) : new Holidays(country, region);
  const dates = (calendar.getHolidays(year) || [])
    .filter((holiday) => holiday.type === 'public')
    .map((holiday) => holiday.date.slice(0, 10));
  publicHolidayCache.set(key, dates);
  return dates;
}

/** The calendar years spanned by local dates (YYYY-MM-DD), for asking the holiday calendar. */
export function yearsOf(localDates: readonly string[]): number[] {
  const years = new Set<number>();
  let previous = '';
  // Hourly dates repeat 24 times in a row: parse each day once.
  for (const date of localDates) {
    if (date === previous) continue;
    previous = date;
    years.add(Number(date.slice(0, 4)));
  }
  return [...years].sort((a, b) => a - b);
}

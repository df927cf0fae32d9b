/**
 * The organisation's holiday calendar: seeding it from the `date-holidays` package for its country and
 * region, and turning it into the engine's HolidaySpec for the calendar regressors.
 */
import Holidays from 'date-holidays';
import type { HolidaySpec } from '@loadwright/forecasting';
import type { Queryable } from './series-window';

/** The organisation's holiday country and region (null country: no calendar). */
export interface HolidayPlace {
  country: string | null;
  region: string | null;
}

/** Where the organisation's holidays come from. */
export async function readHolidayPlace(db: Queryable): Promise<HolidayPlace> {
  const { rows } = await db.query({ text: 'select holiday_country, holiday_region from organisation limit 1' });
  const row = rows[0] as { holiday_country: string | null; holiday_region: string | null } | undefined;
  return { country: row?.holiday_country ?? null, region: row?.holiday_region ?? null };
}

/** The public holidays of the package for `place` in `year`, as calendar rows. */
export function packageHolidays(place: HolidayPlace, year: number): Array<{ day: string; name: string }> {
  if (!place.country) return [];
  const calendar = place.region ? new Holidays(place.country, place.region) : new Holidays(place.country);
  return (calendar.getHolidays(year) || []).filter((h) => h.type === 'public').map((h) => ({ day: h.date.slice(0, 10), name: h.name }));
}

/**
 * Adds the package's public holidays for each year that holds no package entry yet (so a day a planner
 * deleted from a seeded year stays deleted); returns the number of days added.
 */
export async function seedHolidayYears(db: Queryable, place: HolidayPlace, years: readonly number[]): Promise<number> {
  if (!place.country) return 0;
  let added = 0;
  for (const year of years) {
    const { rows } = await db.query({
      text: `select 1 from holidays where source = 'package' and day between $1::date and $2::date limit 1`,
      values: [`${year}-01-01`, `${year}-12-31`],
    });
    if (rows.length > 0) continue;
    const days = packageHolidays(place, year);
    if (days.length === 0) continue;
    const result = await db.query({
      text: `insert into holidays (day, name, kind, source)
             select d::date, n, 'public', 'package' from unnest($1::text[], $2::text[]) as u(d, n)
             on conflict on constraint holidays_day_name_key do nothing returning id`,
      values: [days.map((d) => d.day), days.map((d) => d.name)],
    });
    added += result.rows.length;
  }
  return added;
}

/** Cached calendars by database, for at most a minute (the nightly run reads it once per series). */
const cache = new WeakMap<object, { at: number; spec: HolidaySpec | null }>();

/**
 * The calendar as the engine wants it: the package's public days of the country/region plus every day
 * in the table as extra dates (manual days included), less the package's days of seeded years that a
 * planner removed from the table (a removed public holiday stops counting). Null without a holiday country.
 */
export async function readHolidaySpec(db: Queryable): Promise<HolidaySpec | null> {
  const cached = cache.get(db);
  if (cached && Date.now() - cached.at < 60_000) return cached.spec;
  const place = await readHolidayPlace(db);
  let spec: HolidaySpec | null = null;
  if (place.country) {
    const { rows } = await db.query({ text: `select to_char(day, 'YYYY-MM-DD') as day, source from holidays order by day` });
    const days = rows as Array<{ day: string; source: string }>;
    const inTable = new Set(days.map((r) => r.day));
    const seededYears = [...new Set(days.filter((r) => r.source === 'package').map((r) => Number(r.day.slice(0, 4))))];
    const excludedDates = seededYears.flatMap((year) => packageHolidays(place, year).map((h) => h.day)).filter((day) => !inTable.has(day));
    spec = {
      country: place.country,
      ...(place.region ? { region: place.region } : {}),
      extraDates: days.map((r) => r.day),
      excludedDates,
    };
  }
  cache.set(db, { at: Date.now(), spec });
  return spec;
}

/**
 * Gathers what explaining one miss event needs (the version's temperature response, the temperatures
 * it used (readings, else the temperature forecast issue its fit names) and the ones observed since, holidays, the band's recent record at those hours) and stores
 * the explanation on the event.
 */
import { and, eq, sql } from 'drizzle-orm';
import { fits, forecastVersions, holidays, missEvents, organisation, series, type Database } from '@loadwright/db';
import { localClock } from '@loadwright/forecasts';
import { packageHolidays } from '@loadwright/refits';
import { explainMiss, type HourTemperatures, type MissCause, type MissContext, type TemperatureResponse } from './explain-miss';
import { bandAt, hourMs, type EvidenceHour } from './hour-point';
import type { EventDetail } from './miss-repository';
import { hourPointsOf, watchedSeries } from './miss-repository';
import type { LoadUnit } from './rule-kinds';

/** Days looked back over to judge whether the band misses too often at an hour. */
export const bandRecordDays = 28;

/** The temperature response of a fit, when its model has degree-hour regressors. */
export function temperatureResponseOf(
  parameters: Record<string, unknown>,
  specSnapshot: Record<string, unknown>,
  stationUnit: string | null,
): TemperatureResponse | null {
  const regression = parameters['regression'] as { names?: string[]; coefficients?: number[] } | undefined;
  const names = regression?.names ?? [];
  const h = names.indexOf('heating-degree-hours');
  const c = names.indexOf('cooling-degree-hours');
  if ((h < 0 && c < 0) || (stationUnit !== 'degF' && stationUnit !== 'degC')) return null;
  const settings = (specSnapshot['temperature'] ?? {}) as { heatingBase?: number | null; coolingBase?: number | null };
  // The refit's own defaults (libs/refits model-plan.ts): 59.9/71.6 °F, 15.5/22 °C.
  const defaults = stationUnit === 'degF' ? { heatingBase: 59.9, coolingBase: 71.6 } : { heatingBase: 15.5, coolingBase: 22 };
  return {
    heatingCoefficient: h >= 0 ? (regression!.coefficients![h] ?? 0) : 0,
    coolingCoefficient: c >= 0 ? (regression!.coefficients![c] ?? 0) : 0,
    heatingBase: settings.heatingBase ?? defaults.heatingBase,
    coolingBase: settings.coolingBase ?? defaults.coolingBase,
    log: specSnapshot['log'] === true,
    unit: stationUnit,
  };
}

/**
 * For each hour, the station's temperature as the forecast assumed it and as observed since.
 *
 * Assumed: what the refit read when it wrote the version at `issuedAt`: the station's reading in force
 * then (a revision superseded later, or the current reading when it was stored before), else the value of
 * the temperature forecast issue the fit names (`forecastIssuedAt`, libs/refits series-window.ts). A fit
 * that names no issue (written before issues existed, or covered by readings alone) falls back to the
 * readings alone. Observed: the current reading, when it was stored after the version was issued (a
 * reading stored before issue for a forecast hour is itself a forecast).
 */
export async function temperaturesAround(
  db: Pick<Database, 'execute'>,
  stationId: number,
  issuedAt: Date,
  hours: string[],
  forecastIssuedAt: Date | null = null,
): Promise<HourTemperatures[]> {
  if (hours.length === 0) return [];
  const list = `{${hours.join(',')}}`;
  const current = await db.execute<{ ts: string; value: number | null; stored_at: string | null }>(sql`
    select to_char(o.ts at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"') as ts, coalesce(o.estimated, o.value) as value, u.created_at as stored_at
      from observations o left join uploads u on u.id = o.upload_id
     where o.series_id = ${stationId} and o.ts = any(${list}::timestamptz[])`);
  const revisions = await db.execute<{ ts: string; value: number | null }>(sql`
    select distinct on (r.ts) to_char(r.ts at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"') as ts, coalesce(r.estimated, r.value) as value
      from observation_revisions r
     where r.series_id = ${stationId} and r.ts = any(${list}::timestamptz[]) and r.superseded_at > ${issuedAt.toISOString()}::timestamptz
     order by r.ts, r.revision`);
  const issued = forecastIssuedAt
    ? await db.execute<{ ts: string; value: number }>(sql`
    select to_char(f.ts at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"') as ts, f.value
      from temperature_forecasts f
     where f.series_id = ${stationId} and f.issued_at = ${forecastIssuedAt.toISOString()}::timestamptz and f.ts = any(${list}::timestamptz[])`)
    : { rows: [] };
  const replaced = new Map(revisions.rows.map((row) => [row.ts, row.value]));
  const fromIssue = new Map(issued.rows.map((row) => [row.ts, row.value]));
  const now = new Map(current.rows.map((row) => [row.ts, row]));
  return hours.map((ts) => {
    const row = now.get(ts);
    const storedAfter = row?.stored_at ? new Date(row.stored_at) > issuedAt : false;
    const reading = replaced.has(ts) ? replaced.get(ts)! : row && !storedAfter ? row.value : null;
    return { ts, forecast: reading ?? fromIssue.get(ts) ?? null, observed: row && storedAfter ? row.value : null };
  });
}

/** The temperature forecast issue a fit used for its forecast hours, as the refit recorded it. */
export function forecastIssueOf(diagnostics: Record<string, unknown> | null): Date | null {
  const temperature = (diagnostics?.['temperature'] ?? {}) as { forecastIssuedAt?: unknown };
  return typeof temperature.forecastIssuedAt === 'string' ? new Date(temperature.forecastIssuedAt) : null;
}

/** Public holidays of the organisation's country on the local days of the miss that the calendar lacks. */
async function holidaysMissing(db: Database, days: string[]): Promise<MissContext['holidaysMissing']> {
  const [row] = await db.select({ country: organisation.holidayCountry, region: organisation.holidayRegion }).from(organisation).limit(1);
  const place = { country: row?.country ?? null, region: row?.region ?? null };
  if (!place.country || days.length === 0) return [];
  const inCalendar = new Set(
    (
      await db
        .select({ day: holidays.day })
        .from(holidays)
        .where(sql`${holidays.day} = any(${`{${days.join(',')}}`}::date[])`)
    ).map((row) => row.day),
  );
  const years = [...new Set(days.map((day) => Number(day.slice(0, 4))))];
  const publicDays = years.flatMap((year) => packageHolidays(place, year));
  return publicDays.filter((holiday) => days.includes(holiday.day) && !inCalendar.has(holiday.day));
}

/** Local hours of the miss at which the 95 % band missed more than twice its nominal 5 % (and at least 3 times) in the 28 days before. */
async function bandRecord(db: Database, seriesId: number, before: Date, localHours: string[]) {
  const [watched] = await watchedSeries(db, [seriesId]);
  if (!watched || localHours.length === 0) return [];
  const points = await hourPointsOf(db, watched, new Date(before.getTime() - bandRecordDays * 24 * hourMs), before);
  const tally = new Map<string, { misses: number; days: number }>();
  for (const point of points) {
    const band = bandAt(point, 95);
    if (point.actual === null || band.lower === null || band.upper === null) continue;
    const hour = `${localClock(point.ts, watched.timeZone).time.slice(0, 2)}:00`;
    const t = tally.get(hour) ?? { misses: 0, days: 0 };
    t.days++;
    if (point.actual < band.lower || point.actual > band.upper) t.misses++;
    tally.set(hour, t);
  }
  return localHours.flatMap((hour) => {
    const t = tally.get(hour);
    return t && t.misses >= 3 && t.misses / t.days > 0.1 ? [{ hour, misses: t.misses, days: t.days, level: 95 }] : [];
  });
}

/** Explains event `eventId` from what is stored now, and keeps the explanation on the event. */
export async function explainEvent(db: Database, eventId: number): Promise<MissCause | null> {
  const [event] = await db.select().from(missEvents).where(eq(missEvents.id, eventId));
  if (!event) return null;
  const detail = event.detail as EventDetail;
  const hours: EvidenceHour[] = (detail.hours ?? []).filter((hour) => hour.forecast !== null);
  if (hours.length === 0) return null;
  const [own] = await db
    .select({ unit: series.unit, timeZone: series.timeZone, stationId: series.temperatureSeriesId })
    .from(series)
    .where(eq(series.id, event.seriesId));
  const [station] = own?.stationId ? await db.select({ unit: series.unit }).from(series).where(eq(series.id, own.stationId)) : [];
  const versionId = event.versionId ?? hours[0]!.versionId;
  const [version] = versionId
    ? await db
        .select({
          issuedAt: forecastVersions.issuedAt,
          parameters: fits.parameters,
          specSnapshot: fits.specSnapshot,
          diagnostics: fits.diagnostics,
        })
        .from(forecastVersions)
        .innerJoin(fits, eq(fits.id, forecastVersions.fitId))
        .where(and(eq(forecastVersions.id, versionId)))
    : [];
  const response =
    version && own?.stationId ? temperatureResponseOf(version.parameters, version.specSnapshot, station?.unit ?? null) : null;
  const temperatures =
    response && own?.stationId && version
      ? await temperaturesAround(
          db,
          own.stationId,
          version.issuedAt,
          hours.map((hour) => hour.ts),
          forecastIssueOf(version.diagnostics),
        )
      : [];
  const timeZone = own?.timeZone ?? 'UTC';
  const days = [...new Set(hours.map((hour) => localClock(new Date(hour.ts), timeZone).date))];
  const localHours = [...new Set(hours.map((hour) => `${localClock(new Date(hour.ts), timeZone).time.slice(0, 2)}:00`))];
  const context: MissContext = {
    holidaysMissing: await holidaysMissing(db, days),
    bandTooNarrowAt: await bandRecord(db, event.seriesId, event.periodStart, localHours),
  };
  const cause = explainMiss(hours, temperatures, response, context, (own?.unit ?? 'kW') as LoadUnit);
  await db
    .update(missEvents)
    .set({ cause: { ...cause } })
    .where(eq(missEvents.id, eventId));
  return cause;
}

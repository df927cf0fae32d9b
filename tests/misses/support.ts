/** Series, forecasts, actuals and rules for miss tests, written the way the product writes them. */
import { and, asc, eq, sql } from 'drizzle-orm';
import { forecastVersions, missEvents, missRules, observations, series, type Database } from '@loadwright/db';
import type { RuleSettings } from '@loadwright/misses';
import { writeDraftVersion } from '../forecasts/support/draft-versions';

/** 95 % band of ±10 around the mean: se = 10 / z₀.₉₇₅. */
export const seFor10 = 10 / 1.959963984540054;

/** A load series in America/Chicago, hourly, kW. */
export async function loadSeries(db: Database, key: string, unit: 'kW' | 'MW' = 'kW'): Promise<number> {
  const [row] = await db
    .insert(series)
    .values({ key, name: `Test ${key}`, kind: 'load', level: 'feeder', unit, intervalMinutes: 60, timeZone: 'America/Chicago' })
    .returning({ id: series.id });
  return row!.id;
}

/** Writes a draft (flat 100 unless `mean` says otherwise, band ±10) and approves it; returns its id. */
export async function approvedForecast(
  db: Database,
  seriesId: number,
  origin: string,
  hours: number,
  mean?: (i: number, ts: Date) => number,
): Promise<number> {
  const id = await writeDraftVersion(db, { seriesId, origin: new Date(origin), hours, mean: mean ?? (() => 100), stdError: () => seFor10 });
  await db
    .update(forecastVersions)
    .set({ state: 'approved', approvedAt: new Date(origin) })
    .where(eq(forecastVersions.id, id));
  return id;
}

/** Stores hourly actuals from `start`; `estimated` marks readings replaced by a steward's estimate. */
export async function actuals(db: Database, seriesId: number, start: string, values: number[], estimated = false): Promise<void> {
  const t0 = Date.parse(start);
  await db
    .insert(observations)
    .values(
      values.map((value, i) => ({
        seriesId,
        ts: new Date(t0 + i * 3_600_000),
        value: estimated ? null : value,
        estimated: estimated ? value : null,
        quality: estimated ? 3 : 0,
      })),
    )
    .onConflictDoUpdate({
      target: [observations.seriesId, observations.ts],
      set: { value: sqlExcluded('value'), estimated: sqlExcluded('estimated'), quality: sqlExcluded('quality') },
    });
}

const sqlExcluded = (column: string) => sql.raw(`excluded.${column}`);

/** Adds a rule for one series only. */
export async function seriesRule(
  db: Database,
  seriesId: number,
  settings: Partial<RuleSettings> & Pick<RuleSettings, 'kind'> & { severity?: 'low' | 'medium' | 'high'; recipients?: string[] },
): Promise<number> {
  const [row] = await db
    .insert(missRules)
    .values({ name: `${settings.kind} for ${seriesId}`, scope: 'series', scopeSeriesId: seriesId, severity: 'high', ...settings })
    .returning({ id: missRules.id });
  return row!.id;
}

/** The series' events, oldest first. */
export function eventsOf(db: Database, seriesId: number) {
  return db
    .select()
    .from(missEvents)
    .where(and(eq(missEvents.seriesId, seriesId)))
    .orderBy(asc(missEvents.periodStart));
}

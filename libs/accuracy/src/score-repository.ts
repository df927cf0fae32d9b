/** Reading what scoring needs (versions, hourly actuals, the holiday calendar) and writing and reading scored hours. */
import { and, asc, desc, eq, gte, lt, sql } from 'drizzle-orm';
import { forecastHourScores, forecastVersions, holidays, series, type Database } from '@loadwright/db';
import type { ScoredHour } from './scored-hour';
import type { VersionToScore } from './score-version';

/** A database or a transaction. */
export type ScoreDb = Pick<Database, 'select' | 'insert' | 'execute'>;

const hourMs = 3_600_000;

/** A series scoring applies to: an active load series of hourly or finer readings. */
export interface ScorableSeries {
  id: number;
  timeZone: string;
  intervalMinutes: number;
}

/** The series, when it is one scoring applies to. */
export async function scorableSeries(db: ScoreDb, seriesId?: number): Promise<ScorableSeries[]> {
  const rows = await db
    .select({
      id: series.id,
      timeZone: series.timeZone,
      intervalMinutes: series.intervalMinutes,
      kind: series.kind,
      archivedAt: series.archivedAt,
    })
    .from(series)
    .where(seriesId === undefined ? undefined : eq(series.id, seriesId))
    .orderBy(asc(series.id));
  return rows
    .filter((row) => row.kind === 'load' && row.archivedAt === null && row.intervalMinutes <= 60)
    .map(({ id, timeZone, intervalMinutes }) => ({ id, timeZone, intervalMinutes }));
}

/** Versions of the series whose hours reach past `since` and began before `until`. */
export async function versionsToScore(db: ScoreDb, seriesId: number, since: Date, until: Date): Promise<VersionToScore[]> {
  return db
    .select({ id: forecastVersions.id, origin: forecastVersions.origin, horizonHours: forecastVersions.horizonHours })
    .from(forecastVersions)
    .where(
      and(
        eq(forecastVersions.seriesId, seriesId),
        lt(forecastVersions.origin, until),
        sql`${forecastVersions.origin} + make_interval(hours => ${forecastVersions.horizonHours}) > ${since.toISOString()}::timestamptz`,
      ),
    )
    .orderBy(asc(forecastVersions.origin));
}

/**
 * Hourly actuals of a series over [from, to), keyed by the hour's start in epoch milliseconds: the
 * mean of the hour's readings (the estimate where one replaced a reading), only for hours whose every
 * interval arrived. Hours are counted from `anchor` (a forecast instant), so series in half-hour zones
 * bucket like their forecasts.
 */
export async function hourlyActuals(db: ScoreDb, target: ScorableSeries, from: Date, to: Date, anchor: Date): Promise<Map<number, number>> {
  const perHour = Math.round(60 / target.intervalMinutes);
  const { rows } = await db.execute<{ hour_ms: number; value: number }>(sql`
    select (extract(epoch from date_bin('1 hour', ts, ${anchor.toISOString()}::timestamptz)) * 1000)::float8 as hour_ms,
           avg(coalesce(estimated, value))::float8 as value
      from observations
     where series_id = ${target.id} and ts >= ${from.toISOString()}::timestamptz and ts < ${to.toISOString()}::timestamptz
       and coalesce(estimated, value) is not null
     group by 1
    having count(*) >= ${perHour}`);
  return new Map(rows.map((row) => [Number(row.hour_ms), Number(row.value)]));
}

/** The holiday calendar's dates within [from, to] (a day either side, for local dates). */
export async function holidayDates(db: ScoreDb, from: Date, to: Date): Promise<Set<string>> {
  const rows = await db
    .select({ day: holidays.day })
    .from(holidays)
    .where(
      and(
        gte(holidays.day, new Date(from.getTime() - 24 * hourMs).toISOString().slice(0, 10)),
        lt(holidays.day, new Date(to.getTime() + 48 * hourMs).toISOString().slice(0, 10)),
      ),
    );
  return new Set(rows.map((row) => row.day));
}

const excluded = (column: string) => sql.raw(`excluded.${column}`);

/** Writes scored hours of a series, replacing the stored ones of the same version and hour. */
export async function writeScores(db: ScoreDb, seriesId: number, hours: readonly ScoredHour[]): Promise<void> {
  for (let i = 0; i < hours.length; i += 1000) {
    await db
      .insert(forecastHourScores)
      .values(hours.slice(i, i + 1000).map((hour) => ({ ...hour, seriesId })))
      .onConflictDoUpdate({
        target: [forecastHourScores.versionId, forecastHourScores.ts],
        set: {
          horizon: excluded('horizon'),
          localDate: excluded('local_date'),
          localHour: excluded('local_hour'),
          dayType: excluded('day_type'),
          actual: excluded('actual'),
          forecast: excluded('forecast'),
          naive: excluded('naive'),
          scale: excluded('scale'),
          lower80: excluded('lower_80'),
          upper80: excluded('upper_80'),
          lower95: excluded('lower_95'),
          upper95: excluded('upper_95'),
        },
      });
  }
}

/** A scored hour with what the version it belongs to was. */
export interface StoredScore extends ScoredHour {
  state: 'draft' | 'approved' | 'superseded';
  bandKind: 'empirical' | 'gaussian';
  origin: Date;
  horizonHours: number;
  approvedAt: Date | null;
}

/** Start of the hour after the newest scored hour of one series (or of all), or null when none is scored. */
export async function scoredUntil(db: ScoreDb, seriesId?: number): Promise<Date | null> {
  const [row] = await db
    .select({ ts: forecastHourScores.ts })
    .from(forecastHourScores)
    .where(seriesId === undefined ? undefined : eq(forecastHourScores.seriesId, seriesId))
    .orderBy(desc(forecastHourScores.ts))
    .limit(1);
  return row ? new Date(row.ts.getTime() + hourMs) : null;
}

/** The series' scored hours in [from, to), in time order, each with its version's state and band kind. */
export async function storedScores(db: ScoreDb, seriesId: number, from: Date, to: Date): Promise<StoredScore[]> {
  const rows = await db
    .select({
      versionId: forecastHourScores.versionId,
      ts: forecastHourScores.ts,
      horizon: forecastHourScores.horizon,
      localDate: forecastHourScores.localDate,
      localHour: forecastHourScores.localHour,
      dayType: forecastHourScores.dayType,
      actual: forecastHourScores.actual,
      forecast: forecastHourScores.forecast,
      naive: forecastHourScores.naive,
      scale: forecastHourScores.scale,
      lower80: forecastHourScores.lower80,
      upper80: forecastHourScores.upper80,
      lower95: forecastHourScores.lower95,
      upper95: forecastHourScores.upper95,
      state: forecastVersions.state,
      bandKind: forecastVersions.bandKind,
      origin: forecastVersions.origin,
      horizonHours: forecastVersions.horizonHours,
      approvedAt: forecastVersions.approvedAt,
    })
    .from(forecastHourScores)
    .innerJoin(forecastVersions, eq(forecastVersions.id, forecastHourScores.versionId))
    .where(and(eq(forecastHourScores.seriesId, seriesId), gte(forecastHourScores.ts, from), lt(forecastHourScores.ts, to)))
    .orderBy(asc(forecastHourScores.ts), asc(forecastHourScores.versionId));
  return rows;
}

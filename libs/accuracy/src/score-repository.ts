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

/** Each stored column with its PostgreSQL type and how a scored hour fills it, in table order. */
const scoreColumns: ReadonlyArray<readonly [string, string, (hour: ScoredHour, seriesId: number) => unknown]> = [
  ['version_id', 'bigint', (h) => h.versionId],
  ['series_id', 'integer', (_h, seriesId) => seriesId],
  ['ts', 'timestamptz', (h) => h.ts.toISOString()],
  ['horizon', 'smallint', (h) => h.horizon],
  ['local_date', 'date', (h) => h.localDate],
  ['local_hour', 'smallint', (h) => h.localHour],
  ['day_type', 'day_type', (h) => h.dayType],
  ['actual', 'float8', (h) => h.actual],
  ['forecast', 'float8', (h) => h.forecast],
  ['naive', 'float8', (h) => h.naive],
  ['scale', 'float8', (h) => h.scale],
  ['lower_80', 'float8', (h) => h.lower80],
  ['upper_80', 'float8', (h) => h.upper80],
  ['lower_95', 'float8', (h) => h.lower95],
  ['upper_95', 'float8', (h) => h.upper95],
];

/** The columns a new score can change (all but the key and the series). */
const changeable = scoreColumns.map(([name]) => name).filter((name) => !['version_id', 'series_id', 'ts'].includes(name));

/**
 * Writes scored hours of a series, replacing the stored ones of the same version and hour. One
 * statement of column arrays (unnest), so thousands of hours travel as 15 parameters; an hour scored
 * again with the same numbers (the hourly job's usual case) is left as it is, making no new row version.
 */
export async function writeScores(db: ScoreDb, seriesId: number, hours: readonly ScoredHour[]): Promise<void> {
  if (hours.length === 0) return;
  const arrays = scoreColumns.map(([, type, value]) => sql`${sql.param(hours.map((hour) => value(hour, seriesId)))}::${sql.raw(type)}[]`);
  const names = sql.raw(scoreColumns.map(([name]) => name).join(', '));
  const updates = sql.raw(changeable.map((name) => `${name} = excluded.${name}`).join(', '));
  const changed = sql.raw(
    `(${changeable.map((name) => `forecast_hour_scores.${name}`).join(', ')}) is distinct from (${changeable.map((name) => `excluded.${name}`).join(', ')})`,
  );
  await db.execute(sql`
    insert into forecast_hour_scores (${names})
    select * from unnest(${sql.join(arrays, sql`, `)})
    on conflict (version_id, ts) do update set ${updates} where ${changed}`);
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

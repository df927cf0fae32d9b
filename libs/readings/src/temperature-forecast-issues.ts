/**
 * Storing and listing a weather station's temperature forecast issues. An issue is kept whole: a second
 * issue with the same issue time is refused rather than merged, so what a refit used can always be read
 * back. Values are converted once, on the way in, to the station's own unit.
 */
import type { PushTemperatureForecast, TemperatureForecastIssue, TemperatureForecastIssueList } from '@loadwright/contracts';
import { plausibleTemperatureC } from '@loadwright/contracts';
import { recordAudit, type Actor } from '@loadwright/audit';
import { temperatureForecasts, type Database, type Series } from '@loadwright/db';
import { HttpProblem } from '@loadwright/problems';
import { and, eq, sql } from 'drizzle-orm';
import { unitConverter } from './unit-conversion';

const hourMs = 3_600_000;
/**
 * An issue may restate up to three days before its issue time (the provider's analysis hours, which a refit
 * whose load actuals lag needs); anything older is a wrong date, not a forecast.
 */
const earliestBeforeIssueMs = 72 * hourMs;

/** Checks a pushed issue against its station and returns the rows to store; a problem lists every bad hour. */
export function issueRows(station: Series, issue: PushTemperatureForecast): { ts: Date; value: number }[] {
  if (station.kind !== 'temperature') {
    throw new HttpProblem('conflict', `${station.key} is a load series; temperature forecasts belong to a weather station.`);
  }
  const stationUnit = station.unit as 'degC' | 'degF';
  const toStation = unitConverter(issue.unit, stationUnit);
  const toC = unitConverter(issue.unit, 'degC');
  const issuedMs = Date.parse(issue.issuedAt);
  const seen = new Set<number>();
  const errors: { pointer: string; detail: string }[] = [];
  issue.hours.forEach((hour, i) => {
    const ms = Date.parse(hour.ts);
    const pointer = `/hours/${i}`;
    if (ms % hourMs !== 0)
      errors.push({ pointer: `${pointer}/ts`, detail: `${hour.ts} is not on the hour; valid hours start at :00 UTC.` });
    else if (seen.has(ms)) errors.push({ pointer: `${pointer}/ts`, detail: `${hour.ts} appears twice in this issue.` });
    else if (ms < issuedMs - earliestBeforeIssueMs)
      errors.push({
        pointer: `${pointer}/ts`,
        detail: `${hour.ts} is more than 72 hours before the issue time ${issue.issuedAt}; check the dates (a forecast covers the hours after it is issued).`,
      });
    seen.add(ms);
    const celsius = toC(hour.value);
    if (!(celsius >= plausibleTemperatureC.min && celsius <= plausibleTemperatureC.max)) {
      errors.push({
        pointer: `${pointer}/value`,
        detail: `${hour.value} ${issue.unit === 'degC' ? '°C' : '°F'} is outside plausible air temperatures (${plausibleTemperatureC.min} to ${plausibleTemperatureC.max} °C). Is the unit right?`,
      });
    }
  });
  if (errors.length > 0) {
    throw new HttpProblem('invalidInput', `${errors.length} of ${issue.hours.length} hours cannot be stored; nothing was stored.`, errors);
  }
  return issue.hours
    .map((hour) => ({ ts: new Date(hour.ts), value: toStation(hour.value) }))
    .sort((a, b) => a.ts.getTime() - b.ts.getTime());
}

/** Stores one issue for a station (all or nothing) and summarises it. */
export async function storeTemperatureForecast(
  db: Database,
  station: Series,
  issue: PushTemperatureForecast,
  caller: { actor: Actor; ip?: string },
): Promise<TemperatureForecastIssue> {
  const rows = issueRows(station, issue);
  const issuedAt = new Date(issue.issuedAt);
  return db.transaction(async (tx) => {
    const inserted = await tx
      .insert(temperatureForecasts)
      .values(rows.map((row) => ({ seriesId: station.id, issuedAt, ts: row.ts, value: row.value })))
      .onConflictDoNothing()
      .returning({ ts: temperatureForecasts.ts });
    if (inserted.length !== rows.length) {
      throw new HttpProblem(
        'conflict',
        `${station.key} already holds a forecast issued at ${issue.issuedAt}; issues are kept as issued and never overwritten. Send a new issue time.`,
      );
    }
    await recordAudit(tx, {
      actor: caller.actor,
      action: 'temperature-forecast.stored',
      targetType: 'series',
      targetId: station.id,
      detail: { issuedAt: issue.issuedAt, hours: rows.length, unit: issue.unit },
      ...(caller.ip !== undefined && { ip: caller.ip }),
    });
    const values = rows.map((r) => r.value);
    return {
      seriesId: station.id,
      key: station.key,
      issuedAt: issuedAt.toISOString(),
      from: rows[0]!.ts.toISOString(),
      to: rows[rows.length - 1]!.ts.toISOString(),
      hours: rows.length,
      unit: station.unit as 'degC' | 'degF',
      converted: issue.unit !== station.unit,
      min: Math.min(...values),
      max: Math.max(...values),
    };
  });
}

/** The issues of a station, newest first (at most `limit`). */
export async function listTemperatureForecasts(db: Database, station: Series, limit = 30): Promise<TemperatureForecastIssueList> {
  if (station.kind !== 'temperature') {
    throw new HttpProblem('conflict', `${station.key} is a load series; temperature forecasts belong to a weather station.`);
  }
  const rows = await db
    .select({
      issuedAt: temperatureForecasts.issuedAt,
      from: sql<Date>`min(${temperatureForecasts.ts})`.mapWith(temperatureForecasts.ts),
      to: sql<Date>`max(${temperatureForecasts.ts})`.mapWith(temperatureForecasts.ts),
      hours: sql<number>`count(*)::int`,
      min: sql<number>`min(${temperatureForecasts.value})`,
      max: sql<number>`max(${temperatureForecasts.value})`,
    })
    .from(temperatureForecasts)
    .where(and(eq(temperatureForecasts.seriesId, station.id)))
    .groupBy(temperatureForecasts.issuedAt)
    .orderBy(sql`${temperatureForecasts.issuedAt} desc`)
    .limit(limit);
  return {
    issues: rows.map((row) => ({
      seriesId: station.id,
      key: station.key,
      issuedAt: row.issuedAt.toISOString(),
      from: row.from.toISOString(),
      to: row.to.toISOString(),
      hours: row.hours,
      unit: station.unit as 'degC' | 'degF',
      min: Number(row.min),
      max: Number(row.max),
    })),
  };
}

/**
 * Storing and listing a weather station's temperature forecast issues. An issue is kept whole: a second
 * issue with the same issue time is refused rather than merged, so what a refit used can always be read
 * back. Values are converted once, on the way in, to the station's own unit. Every issue is stored with
 * the upload that brought it (a pushed body or a CSV file), so the station page can say where it came from.
 */
import { createHash } from 'node:crypto';
import type {
  PushTemperatureForecast,
  TemperatureForecastHours,
  TemperatureForecastIssue,
  TemperatureForecastIssueList,
} from '@loadwright/contracts';
import { plausibleTemperatureC } from '@loadwright/contracts';
import { recordAudit, type Actor } from '@loadwright/audit';
import { apiTokens, temperatureForecasts, uploads, users, type Database, type Series } from '@loadwright/db';
import { HttpProblem } from '@loadwright/problems';
import { asc, eq, and, sql } from 'drizzle-orm';
import { unitConverter } from './unit-conversion';

const hourMs = 3_600_000;
/**
 * An issue may restate up to three days before its issue time (the provider's analysis hours, which a refit
 * whose load actuals lag needs); anything older is a wrong date, not a forecast.
 */
const earliestBeforeIssueMs = 72 * hourMs;

/** A database or an open transaction. */
type Writer = Pick<Database, 'insert' | 'select' | 'update' | 'execute'>;

/** One hour that cannot be stored: its place in the issue, which field, and why. */
export interface IssueHourError {
  index: number;
  field: 'ts' | 'value';
  detail: string;
}

/** Refuses a load series: forecast issues belong to weather stations. */
export function assertStation(station: Series): void {
  if (station.kind !== 'temperature') {
    throw new HttpProblem('conflict', `${station.key} is a load series; temperature forecasts belong to a weather station.`);
  }
}

/** Checks an issue's hours against its station: the rows to store (station unit, time order) and every bad hour. */
export function checkIssueHours(
  station: Series,
  issue: PushTemperatureForecast,
): { rows: { ts: Date; value: number }[]; errors: IssueHourError[] } {
  const stationUnit = station.unit as 'degC' | 'degF';
  const toStation = unitConverter(issue.unit, stationUnit);
  const toC = unitConverter(issue.unit, 'degC');
  const issuedMs = Date.parse(issue.issuedAt);
  const seen = new Set<number>();
  const errors: IssueHourError[] = [];
  issue.hours.forEach((hour, index) => {
    const ms = Date.parse(hour.ts);
    if (ms % hourMs !== 0) errors.push({ index, field: 'ts', detail: `${hour.ts} is not on the hour; valid hours start at :00 UTC.` });
    else if (seen.has(ms)) errors.push({ index, field: 'ts', detail: `${hour.ts} appears twice in this issue.` });
    else if (ms < issuedMs - earliestBeforeIssueMs)
      errors.push({
        index,
        field: 'ts',
        detail: `${hour.ts} is more than 72 hours before the issue time ${issue.issuedAt}; check the dates (a forecast covers the hours after it is issued).`,
      });
    seen.add(ms);
    const celsius = toC(hour.value);
    if (!(celsius >= plausibleTemperatureC.min && celsius <= plausibleTemperatureC.max)) {
      errors.push({
        index,
        field: 'value',
        detail: `${hour.value} ${issue.unit === 'degC' ? '°C' : '°F'} is outside plausible air temperatures (${plausibleTemperatureC.min} to ${plausibleTemperatureC.max} °C). Is the unit right?`,
      });
    }
  });
  const rows = issue.hours
    .map((hour) => ({ ts: new Date(hour.ts), value: toStation(hour.value) }))
    .sort((a, b) => a.ts.getTime() - b.ts.getTime());
  return { rows, errors };
}

/** Checks a pushed issue against its station and returns the rows to store; a problem lists every bad hour. */
export function issueRows(station: Series, issue: PushTemperatureForecast): { ts: Date; value: number }[] {
  assertStation(station);
  const { rows, errors } = checkIssueHours(station, issue);
  if (errors.length > 0) {
    throw new HttpProblem(
      'invalidInput',
      `${errors.length} of ${issue.hours.length} hours cannot be stored; nothing was stored.`,
      errors.map((error) => ({ pointer: `/hours/${error.index}/${error.field}`, detail: error.detail })),
    );
  }
  return rows;
}

/** The summary of an issue's rows (sorted by hour, at least one). */
export function issueSummary(
  station: Series,
  issuedAt: Date,
  rows: readonly { ts: Date; value: number }[],
  converted: boolean,
): TemperatureForecastIssue {
  const values = rows.map((r) => r.value);
  return {
    seriesId: station.id,
    key: station.key,
    issuedAt: issuedAt.toISOString(),
    from: rows[0]!.ts.toISOString(),
    to: rows[rows.length - 1]!.ts.toISOString(),
    hours: rows.length,
    unit: station.unit as 'degC' | 'degF',
    converted,
    min: Math.min(...values),
    max: Math.max(...values),
  };
}

/** The refusal of an issue time the station already holds. */
export function issueExists(station: Series, issuedAt: string, what = 'Send a new issue time.'): HttpProblem {
  return new HttpProblem(
    'conflict',
    `${station.key} already holds a forecast issued at ${issuedAt}; issues are kept as issued and never overwritten. ${what}`,
  );
}

/** Inserts one issue's rows; false when the station already holds that issue time (nothing inserted then counts). */
export async function insertIssue(
  tx: Writer,
  station: Series,
  issuedAt: Date,
  rows: readonly { ts: Date; value: number }[],
  uploadId: number,
): Promise<boolean> {
  const [held] = await tx
    .select({ n: sql<number>`count(*)::int` })
    .from(temperatureForecasts)
    .where(and(eq(temperatureForecasts.seriesId, station.id), eq(temperatureForecasts.issuedAt, issuedAt)));
  if (held!.n > 0) return false;
  const inserted = await tx
    .insert(temperatureForecasts)
    .values(rows.map((row) => ({ seriesId: station.id, issuedAt, ts: row.ts, value: row.value, uploadId })))
    .onConflictDoNothing()
    .returning({ ts: temperatureForecasts.ts });
  return inserted.length === rows.length;
}

/** Who an upload row names as its sender. */
export function uploader(actor: Actor): { uploadedById: number | null; uploadedByTokenId: number | null } {
  return {
    uploadedById: actor.kind === 'user' ? actor.userId : null,
    uploadedByTokenId: actor.kind === 'token' ? actor.tokenId : null,
  };
}

/** Stores one pushed issue for a station (all or nothing, with the push recorded as an upload) and summarises it. */
export async function storeTemperatureForecast(
  db: Database,
  station: Series,
  issue: PushTemperatureForecast,
  caller: { actor: Actor; ip?: string },
): Promise<TemperatureForecastIssue> {
  const rows = issueRows(station, issue);
  const issuedAt = new Date(issue.issuedAt);
  const body = JSON.stringify({ station: station.id, issue });
  return db.transaction(async (tx) => {
    // The same body pushed twice hashes alike; the issue time refuses it below either way.
    const [push] = await tx
      .insert(uploads)
      .values({
        source: 'api',
        content: 'temperature_forecast',
        fileName: `forecast issued ${issuedAt.toISOString()}`,
        contentSha256: createHash('sha256').update(body).digest('hex'),
        byteSize: Buffer.byteLength(body),
        status: 'done',
        rowsTotal: rows.length,
        rowsProcessed: rows.length,
        rowsImported: rows.length,
        progress: 1,
        finishedAt: new Date(),
        ...uploader(caller.actor),
      })
      .onConflictDoNothing()
      .returning({ id: uploads.id });
    if (!push || !(await insertIssue(tx, station, issuedAt, rows, push.id))) throw issueExists(station, issue.issuedAt);
    await recordAudit(tx, {
      actor: caller.actor,
      action: 'temperature-forecast.stored',
      targetType: 'series',
      targetId: station.id,
      detail: { issuedAt: issue.issuedAt, hours: rows.length, unit: issue.unit, uploadId: push.id },
      ...(caller.ip !== undefined && { ip: caller.ip }),
    });
    return issueSummary(station, issuedAt, rows, issue.unit !== station.unit);
  });
}

/** Where an issue came from, in words. */
function sourceWords(row: {
  uploadId: number | null;
  source: string | null;
  fileName: string | null;
  person: string | null;
  token: string | null;
}): string {
  if (row.uploadId === null) return 'sender not recorded';
  const by = row.person ? ` by ${row.person}` : row.token ? ` by token "${row.token}"` : '';
  return row.source === 'api' ? `pushed through the API${by}` : `file ${row.fileName} (upload ${row.uploadId})${by}`;
}

/** The issues of a station, newest first (at most `limit`), each with where it came from. */
export async function listTemperatureForecasts(db: Database, station: Series, limit = 30): Promise<TemperatureForecastIssueList> {
  assertStation(station);
  const rows = await db
    .select({
      issuedAt: temperatureForecasts.issuedAt,
      from: sql<Date>`min(${temperatureForecasts.ts})`.mapWith(temperatureForecasts.ts),
      to: sql<Date>`max(${temperatureForecasts.ts})`.mapWith(temperatureForecasts.ts),
      hours: sql<number>`count(*)::int`,
      min: sql<number>`min(${temperatureForecasts.value})`,
      max: sql<number>`max(${temperatureForecasts.value})`,
      uploadId: sql<number | null>`min(${temperatureForecasts.uploadId})`,
    })
    .from(temperatureForecasts)
    .where(eq(temperatureForecasts.seriesId, station.id))
    .groupBy(temperatureForecasts.issuedAt)
    .orderBy(sql`${temperatureForecasts.issuedAt} desc`)
    .limit(limit);
  const ids = [...new Set(rows.map((row) => row.uploadId).filter((id): id is number => id !== null))];
  const senders = ids.length
    ? await db
        .select({ id: uploads.id, source: uploads.source, fileName: uploads.fileName, person: users.displayName, token: apiTokens.name })
        .from(uploads)
        .leftJoin(users, eq(users.id, uploads.uploadedById))
        .leftJoin(apiTokens, eq(apiTokens.id, uploads.uploadedByTokenId))
        .where(sql`${uploads.id} = any(${`{${ids.join(',')}}`}::int[])`)
    : [];
  const sender = new Map(senders.map((row) => [row.id, row]));
  return {
    issues: rows.map((row) => {
      const from = row.uploadId === null ? undefined : sender.get(row.uploadId);
      return {
        seriesId: station.id,
        key: station.key,
        issuedAt: row.issuedAt.toISOString(),
        from: row.from.toISOString(),
        to: row.to.toISOString(),
        hours: row.hours,
        unit: station.unit as 'degC' | 'degF',
        min: Number(row.min),
        max: Number(row.max),
        uploadId: row.uploadId,
        source: sourceWords({
          uploadId: row.uploadId,
          source: from?.source ?? null,
          fileName: from?.fileName ?? null,
          person: from?.person ?? null,
          token: from?.token ?? null,
        }),
      };
    }),
  };
}

/** The valid hours of one issue of a station, in time order. */
export async function temperatureForecastHours(db: Database, station: Series, issuedAt: string): Promise<TemperatureForecastHours> {
  assertStation(station);
  const rows = await db
    .select({ ts: temperatureForecasts.ts, value: temperatureForecasts.value })
    .from(temperatureForecasts)
    .where(and(eq(temperatureForecasts.seriesId, station.id), eq(temperatureForecasts.issuedAt, new Date(issuedAt))))
    .orderBy(asc(temperatureForecasts.ts));
  if (rows.length === 0) throw new HttpProblem('notFound', `${station.key} holds no forecast issued at ${issuedAt}.`);
  return {
    issuedAt: new Date(issuedAt).toISOString(),
    unit: station.unit as 'degC' | 'degF',
    hours: rows.map((row) => ({ ts: row.ts.toISOString(), value: row.value })),
  };
}

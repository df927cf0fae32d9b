/** Reads of forecast versions, their points, adjustments and fits, and of the series they belong to. */
import { and, asc, desc, eq, gte, inArray, isNull, lt, sql, type SQL } from 'drizzle-orm';
import type { ForecastSeries, ForecastState } from '@loadwright/contracts';
import { fits, forecastAdjustments, forecastPoints, forecastVersions, observations, series, users, type Database } from '@loadwright/db';
import type { AdjustmentRule, ModelPoint } from './adjustment-layer';

/** A database or a transaction: anything that can select. */
export type Reader = Pick<Database, 'select' | 'execute'>;

/** Which series an approval preview or an export covers. */
export type SeriesScope = { kind: 'all' } | { kind: 'series'; ids: number[] } | { kind: 'subtree'; rootId: number };

const seriesColumns = {
  id: series.id,
  key: series.key,
  name: series.name,
  level: series.level,
  parentId: series.parentId,
  unit: series.unit,
  intervalMinutes: series.intervalMinutes,
  timeZone: series.timeZone,
};

/** One series, or null when no series has the id. */
export async function findSeries(db: Reader, id: number): Promise<ForecastSeries | null> {
  const [row] = await db.select(seriesColumns).from(series).where(eq(series.id, id));
  return row ?? null;
}

/**
 * The load series a scope covers, ordered by id: listed ones as given (archived included, since
 * they were asked for by id), a node and all its descendants, or every one; subtree and all leave
 * archived series out.
 */
export async function seriesInScope(db: Reader, scope: SeriesScope): Promise<ForecastSeries[]> {
  const load = eq(series.kind, 'load');
  if (scope.kind === 'series')
    return db
      .select(seriesColumns)
      .from(series)
      .where(and(load, inArray(series.id, scope.ids)))
      .orderBy(asc(series.id));
  if (scope.kind === 'all')
    return db
      .select(seriesColumns)
      .from(series)
      .where(and(load, isNull(series.archivedAt)))
      .orderBy(asc(series.id));
  const subtree = sql`(with recursive subtree(id) as (
      select id from series where id = ${scope.rootId}
      union select s.id from series s join subtree t on s.parent_id = t.id
    ) select id from subtree)`;
  return db
    .select(seriesColumns)
    .from(series)
    .where(and(load, isNull(series.archivedAt), sql`${series.id} in ${subtree}`))
    .orderBy(asc(series.id));
}

/** A version row with its fit and the name of whoever approved it. */
export interface VersionRow {
  id: number;
  seriesId: number;
  state: ForecastState;
  issuedAt: Date;
  origin: Date;
  horizonHours: number;
  levels: number[];
  warnings: { code: string; message: string }[];
  refitRunId: number | null;
  approvedAt: Date | null;
  approvedById: number | null;
  approvedByName: string | null;
  supersededAt: Date | null;
  adjustmentCount: number;
  fit: {
    id: number;
    method: string;
    arOrder: number;
    maOrder: number;
    aic: number | null;
    aicc: number | null;
    bic: number | null;
    sigma2: number | null;
    logLikelihood: number | null;
    observationCount: number;
    dataStart: Date;
    dataEnd: Date;
  };
}

const adjustmentCount = sql<number>`(select count(*)::int from ${forecastAdjustments} where ${forecastAdjustments.versionId} = ${forecastVersions.id})`;

/** Selects version rows matching `where`, newest first, at most `limit`. */
async function selectVersions(db: Reader, where: SQL | undefined, limit?: number): Promise<VersionRow[]> {
  const query = db
    .select({
      id: forecastVersions.id,
      seriesId: forecastVersions.seriesId,
      state: forecastVersions.state,
      issuedAt: forecastVersions.issuedAt,
      origin: forecastVersions.origin,
      horizonHours: forecastVersions.horizonHours,
      levels: forecastVersions.levels,
      warnings: forecastVersions.warnings,
      refitRunId: forecastVersions.refitRunId,
      approvedAt: forecastVersions.approvedAt,
      approvedById: forecastVersions.approvedById,
      approvedByName: users.displayName,
      supersededAt: forecastVersions.supersededAt,
      adjustmentCount,
      fit: {
        id: fits.id,
        method: fits.method,
        arOrder: fits.arOrder,
        maOrder: fits.maOrder,
        aic: fits.aic,
        aicc: fits.aicc,
        bic: fits.bic,
        sigma2: fits.sigma2,
        logLikelihood: fits.logLikelihood,
        observationCount: fits.observationCount,
        dataStart: fits.dataStart,
        dataEnd: fits.dataEnd,
      },
    })
    .from(forecastVersions)
    .innerJoin(fits, eq(fits.id, forecastVersions.fitId))
    .leftJoin(users, eq(users.id, forecastVersions.approvedById))
    .where(where)
    .orderBy(desc(forecastVersions.id));
  return limit === undefined ? query : query.limit(limit);
}

/** Versions by id (any order), with fits. */
export function versionsById(db: Reader, ids: number[]): Promise<VersionRow[]> {
  if (ids.length === 0) return Promise.resolve([]);
  return selectVersions(db, inArray(forecastVersions.id, ids));
}

/** The current draft and approved versions of some series. */
export function currentVersions(db: Reader, seriesIds: number[]): Promise<VersionRow[]> {
  if (seriesIds.length === 0) return Promise.resolve([]);
  return selectVersions(db, and(inArray(forecastVersions.seriesId, seriesIds), inArray(forecastVersions.state, ['draft', 'approved'])));
}

/** A page of one series' versions, newest first. */
export function versionHistory(
  db: Reader,
  seriesId: number,
  options: { state?: ForecastState; before?: number; limit: number },
): Promise<VersionRow[]> {
  const filters: SQL[] = [eq(forecastVersions.seriesId, seriesId)];
  if (options.state) filters.push(eq(forecastVersions.state, options.state));
  if (options.before !== undefined) filters.push(lt(forecastVersions.id, options.before));
  return selectVersions(db, and(...filters), options.limit);
}

/** A stored point with its standard error. */
export interface PointRow extends ModelPoint {
  stdError: number;
}

/** One point row as read: the instant as epoch milliseconds, which parses far faster than a timestamp text. */
interface RawPointRow extends Record<string, unknown> {
  version_id: string;
  ts_ms: number;
  mean: number;
  std_error: number;
  lower_80: number;
  upper_80: number;
  lower_95: number;
  upper_95: number;
}

/** The points of some versions in time order, grouped by version id. */
export async function pointsOf(db: Reader, versionIds: number[]): Promise<Map<number, PointRow[]>> {
  const grouped = new Map<number, PointRow[]>(versionIds.map((id) => [id, []]));
  if (versionIds.length === 0) return grouped;
  const { rows } = await db.execute<RawPointRow>(sql`
    select version_id, (extract(epoch from ts) * 1000)::float8 as ts_ms, mean, std_error, lower_80, upper_80, lower_95, upper_95
      from ${forecastPoints}
     where version_id = any(${`{${versionIds.join(',')}}`}::bigint[])
     order by version_id, ts`);
  for (const row of rows) {
    grouped.get(Number(row.version_id))!.push({
      ts: new Date(row.ts_ms),
      mean: row.mean,
      stdError: row.std_error,
      lower80: row.lower_80,
      upper80: row.upper_80,
      lower95: row.lower_95,
      upper95: row.upper_95,
    });
  }
  return grouped;
}

/** A stored adjustment with who made it. */
export interface AdjustmentRow extends AdjustmentRule {
  versionId: number;
  reason: string;
  createdById: number | null;
  createdByName: string | null;
  createdAt: Date;
}

/** The adjustments of some versions in creation order, grouped by version id. */
export async function adjustmentsOf(db: Reader, versionIds: number[]): Promise<Map<number, AdjustmentRow[]>> {
  const grouped = new Map<number, AdjustmentRow[]>(versionIds.map((id) => [id, []]));
  if (versionIds.length === 0) return grouped;
  const rows = await db
    .select({
      id: forecastAdjustments.id,
      versionId: forecastAdjustments.versionId,
      periodStart: forecastAdjustments.periodStart,
      periodEnd: forecastAdjustments.periodEnd,
      kind: forecastAdjustments.kind,
      amount: forecastAdjustments.amount,
      reason: forecastAdjustments.reason,
      createdById: forecastAdjustments.createdById,
      createdByName: users.displayName,
      createdAt: forecastAdjustments.createdAt,
    })
    .from(forecastAdjustments)
    .leftJoin(users, eq(users.id, forecastAdjustments.createdById))
    .where(inArray(forecastAdjustments.versionId, versionIds))
    .orderBy(asc(forecastAdjustments.id));
  for (const row of rows) grouped.get(row.versionId)!.push(row);
  return grouped;
}

/** A reading to compare forecasts with: the estimate where there is one, else the raw value. */
export interface ActualRow {
  ts: Date;
  value: number;
  estimated: boolean;
}

/** One series' readings in [from, to), in time order. */
export async function actualsBetween(db: Reader, seriesId: number, from: Date, to: Date): Promise<ActualRow[]> {
  const rows = await db
    .select({ ts: observations.ts, value: observations.value, estimated: observations.estimated })
    .from(observations)
    .where(and(eq(observations.seriesId, seriesId), gte(observations.ts, from), lt(observations.ts, to)))
    .orderBy(asc(observations.ts));
  return rows.flatMap((row) => {
    const value = row.estimated ?? row.value;
    return value === null ? [] : [{ ts: row.ts, value, estimated: row.estimated !== null }];
  });
}

/** Something that runs a named (prepared) statement: a pg pool or client. */
export interface StatementRunner {
  query<R extends Record<string, unknown>>(config: { name: string; text: string; values: unknown[] }): Promise<{ rows: R[] }>;
}

/**
 * A text that changes whenever the review of a series would: the series row, each current version's
 * id and state with the count and last id of its adjustments (points never change and adjustments
 * are only added or removed), and every reading in the window the versions span (revision, quality,
 * raw and estimated value). One round trip reading a few hundred rows instead of the review's points,
 * peaks and comparison; a named statement, so PostgreSQL plans it once per connection.
 */
export async function reviewFingerprint(db: StatementRunner, seriesId: number): Promise<string | null> {
  const { rows } = await db.query<{ series: string | null; versions: string | null; actuals: string | null }>({
    name: 'loadwright-review-fingerprint',
    text: `
    with current_versions as (
      select v.id, v.state, v.origin, v.horizon_hours,
             (select count(*) || '/' || coalesce(max(a.id), 0) from forecast_adjustments a where a.version_id = v.id) as adjustments
        from forecast_versions v
       where v.series_id = $1 and v.state in ('draft', 'approved')
    ), window_span as (
      select min(origin) as from_ts, max(origin + horizon_hours * interval '1 hour') as to_ts from current_versions
    )
    select (select md5(s::text) from series s where s.id = $1) as series,
           (select string_agg(id || ':' || state || ':' || adjustments, ',' order by id) from current_versions) as versions,
           (select md5(coalesce(string_agg(o.revision || ':' || o.quality || ':' || coalesce(o.value::text, '') || ':' || coalesce(o.estimated::text, ''), ',' order by o.ts), ''))
              from observations o, window_span w
             where o.series_id = $1 and o.ts >= w.from_ts and o.ts < w.to_ts) as actuals`,
    values: [seriesId],
  });
  const row = rows[0];
  if (!row?.series) return null;
  return `${row.series}|${row.versions ?? ''}|${row.actuals ?? ''}`;
}

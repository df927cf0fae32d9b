/**
 * Reads what one series' refit needs: the series, its model settings, the training window of hourly
 * values (validation estimates in place of flagged or missing readings, excluded hours left out and
 * bridged), and the linked station's temperatures over the window and the forecast hours.
 *
 * The forecast hours take the station's observed readings where it has them (a station often reports
 * past the load's last reading), and otherwise the latest temperature forecast issue (temperature_forecasts)
 * issued at or before the refit runs; an issue is used as issued, never mixed with another.
 */
import { qualityFlag } from '@loadwright/db';
import { countMissing, fillInteriorGaps } from './fill-gaps';
import { defaultModelSettings, settingsFromRow, type ModelSpecRow } from './model-settings';
import { RefitDataError } from './refit-errors';
import type { ModelSettingsRequest } from '@loadwright/contracts';

/** Anything that runs parameterised SQL: a pg Pool or a checked-out client. */
export interface Queryable {
  query(config: { text: string; values?: unknown[]; rowMode?: 'array' }): Promise<{ rows: unknown[] }>;
}

/** One hour in milliseconds. */
export const HOUR_MS = 3_600_000;
/** Shortest training window the refit accepts: two weeks, so the weekly cycle is seen twice. */
export const MIN_TRAINING_HOURS = 336;
/** Most of the window that may be missing (bridged by straight lines) before the refit refuses. */
export const MAX_MISSING_SHARE = 0.2;
/** Longest temperature gap bridged inside the forecast hours. */
const MAX_FUTURE_TEMPERATURE_GAP = 3;
/** Least share of training hours the station must cover for temperature regressors. */
const MIN_TEMPERATURE_COVERAGE = 0.9;
/** Readings whose raw value is suspect: without an estimate they count as missing. */
const suspect = qualityFlag.spike | qualityFlag.flatLine | qualityFlag.negative | qualityFlag.impossible;

/** The series as the refit sees it. */
export interface RefitSeries {
  id: number;
  key: string;
  name: string;
  unit: string;
  intervalMinutes: number;
  timeZone: string;
  temperatureSeriesId: number | null;
}

/** The linked weather station. */
export interface Station {
  id: number;
  key: string;
  name: string;
  unit: string;
}

/** Hourly training data ending at the last usable reading. */
export interface TrainingWindow {
  timestamps: Float64Array;
  values: Float64Array;
  /** Hours bridged by straight lines (missing rows, excluded or unestimated suspect readings). */
  bridgedHours: number;
}

/** The station's temperatures on the training hours and the forecast hours, or why they cannot be used. */
export type TemperatureInputs =
  | {
      usable: true;
      station: Station;
      training: Float64Array;
      future: Float64Array;
      /** The forecast issue the forecast hours came from (null when observed readings covered them all). */
      forecastIssue?: TemperatureIssueUsed | null;
    }
  | { usable: false; station: Station | null; reason: string; fallback: boolean };

/** Which temperature forecast issue a refit used, and for how many of its forecast hours. */
export interface TemperatureIssueUsed {
  issuedAt: Date;
  hours: number;
  /** In words for the model card, e.g. "forecast issued 2026-12-01 06:00 UTC (168 hours)". */
  description: string;
}

/** Everything read for one refit. */
export interface RefitInputs {
  series: RefitSeries;
  settings: ModelSettingsRequest;
  window: TrainingWindow;
  temperature: TemperatureInputs;
}

/** Reads the series, its settings, window and temperatures; throws RefitDataError when unusable. */
export async function readRefitInputs(db: Queryable, seriesId: number, asOf: Date = new Date()): Promise<RefitInputs> {
  const series = await readSeries(db, seriesId);
  if (series.intervalMinutes !== 60) {
    throw new RefitDataError(`${series.key} records every ${series.intervalMinutes} minutes; the refit models hourly series only`);
  }
  const specRows = (await db.query({ text: 'select * from model_specs where series_id = $1', values: [seriesId] })).rows as Array<
    Record<string, unknown>
  >;
  const settings = specRows[0] ? settingsFromRow(camelRow(specRows[0]) as unknown as ModelSpecRow) : defaultModelSettings;
  const window = await readTrainingWindow(db, series, settings.trainingWindowDays);
  const temperature = settings.temperature.enabled
    ? await readTemperature(db, series, window, settings.horizonHours, asOf)
    : { usable: false as const, station: null, reason: 'temperature regressors are switched off in the settings', fallback: false };
  return { series, settings, window, temperature };
}

/** The series row; refuses unknown, archived or temperature series. */
export async function readSeries(db: Queryable, seriesId: number): Promise<RefitSeries> {
  const { rows } = await db.query({
    text: 'select id, key, name, kind, unit, interval_minutes, time_zone, temperature_series_id, archived_at from series where id = $1',
    values: [seriesId],
  });
  const row = rows[0] as Record<string, unknown> | undefined;
  if (!row) throw new RefitDataError(`series ${seriesId} does not exist`);
  if (row['kind'] !== 'load') throw new RefitDataError(`${row['key']} is a temperature series; only load series are refitted`);
  if (row['archived_at']) throw new RefitDataError(`${row['key']} is archived`);
  return {
    id: Number(row['id']),
    key: String(row['key']),
    name: String(row['name']),
    unit: String(row['unit']),
    intervalMinutes: Number(row['interval_minutes']),
    timeZone: String(row['time_zone']),
    temperatureSeriesId: row['temperature_series_id'] === null ? null : Number(row['temperature_series_id']),
  };
}

/**
 * Hourly values of `seriesId` on (fromMs, toMs], NaN where no usable value exists. The value to use is
 * chosen in SQL (two columns to parse instead of four): the estimate where validation set one, else a
 * raw value that no defect flag marks; excluded hours give nothing.
 */
export async function readHourly(db: Queryable, seriesId: number, fromMs: number, toMs: number): Promise<Float64Array> {
  const hours = Math.round((toMs - fromMs) / HOUR_MS);
  const out = new Float64Array(hours).fill(Number.NaN);
  const { rows } = await db.query({
    text: `select (extract(epoch from ts) * 1000)::float8,
                  case when quality & $4 <> 0 then null
                       when quality & $5 <> 0 and estimated is not null then estimated
                       when value is not null and quality & $6 = 0 then value
                       else estimated end
             from observations where series_id = $1 and ts > to_timestamp($2::float8 / 1000) and ts <= to_timestamp($3::float8 / 1000)`,
    values: [seriesId, fromMs, toMs, qualityFlag.excluded, qualityFlag.estimated, suspect],
    rowMode: 'array',
  });
  for (const [ts, value] of rows as Array<[number, number | null]>) {
    if (value === null) continue;
    const index = Math.round((ts - fromMs) / HOUR_MS) - 1;
    if (index >= 0 && index < hours) out[index] = value;
  }
  return out;
}

/** Station readings by station and span, kept briefly: in a nightly run every feeder of a station asks for the same hours. */
const stationCache = new Map<string, { at: number; values: Float64Array }>();
/** How long a station's readings are reused, in milliseconds. */
const STATION_CACHE_MS = 120_000;

/**
 * Hourly readings of a station on (fromMs, toMs], from the cache when the same span was read within two
 * minutes and the station's newest reading is unchanged (a new forecast upload is seen at once; a
 * correction of past readings within two minutes).
 */
async function readStationHourly(db: Queryable, stationId: number, fromMs: number, toMs: number): Promise<Float64Array> {
  const { rows } = await db.query({
    text: 'select (extract(epoch from max(ts)) * 1000)::float8 as newest from observations where series_id = $1',
    values: [stationId],
  });
  const { newest } = rows[0] as { newest: number | null };
  const key = `${stationId}:${fromMs}:${toMs}:${newest}`;
  const now = Date.now();
  const hit = stationCache.get(key);
  if (hit && now - hit.at < STATION_CACHE_MS) return hit.values.slice();
  const values = await readHourly(db, stationId, fromMs, toMs);
  for (const [cached, entry] of stationCache) if (now - entry.at >= STATION_CACHE_MS) stationCache.delete(cached);
  stationCache.set(key, { at: now, values });
  return values.slice();
}

/** The last `days` of hourly values up to the last reading, checked for length, gaps and variation. */
async function readTrainingWindow(db: Queryable, series: RefitSeries, days: number): Promise<TrainingWindow> {
  const { rows } = await db.query({
    text: 'select (extract(epoch from max(ts)) * 1000)::float8 as last from observations where series_id = $1',
    values: [series.id],
  });
  const last = (rows[0] as { last: number | null }).last;
  if (last === null) throw new RefitDataError(`${series.key} has no readings yet`);
  const hours = days * 24;
  const raw = await readHourly(db, series.id, last - hours * HOUR_MS, last);
  let first = 0;
  while (first < raw.length && Number.isNaN(raw[first])) first++;
  let end = raw.length;
  while (end > first && Number.isNaN(raw[end - 1])) end--;
  const values = raw.slice(first, end);
  const n = values.length;
  if (n < MIN_TRAINING_HOURS) {
    throw new RefitDataError(
      `${series.key} has ${n} usable hours in its training window; the refit needs at least ${MIN_TRAINING_HOURS} (two weeks)`,
    );
  }
  const missing = countMissing(values);
  if (missing > MAX_MISSING_SHARE * n) {
    throw new RefitDataError(
      `${series.key} misses ${missing} of ${n} hours (${Math.round((100 * missing) / n)} %) in its training window; at most ${MAX_MISSING_SHARE * 100} % can be bridged`,
    );
  }
  const bridgedHours = fillInteriorGaps(values, Number.POSITIVE_INFINITY);
  let min = Infinity;
  let max = -Infinity;
  for (let t = 0; t < n; t++) {
    if (values[t] < min) min = values[t];
    if (values[t] > max) max = values[t];
  }
  if (max - min <= 1e-9 * Math.max(1, Math.abs(max))) {
    throw new RefitDataError(
      `${series.key} holds the same value (${max}) in every hour of its training window: there is no variation to model`,
    );
  }
  // Grid hour i of `raw` is last − (hours − 1 − i) hours.
  const startMs = last - (hours - 1 - first) * HOUR_MS;
  const timestamps = Float64Array.from({ length: n }, (_, t) => startMs + t * HOUR_MS);
  return { timestamps, values, bridgedHours };
}

/** The station's temperatures aligned with the training hours and the horizon, or why not. */
async function readTemperature(
  db: Queryable,
  series: RefitSeries,
  window: TrainingWindow,
  horizon: number,
  asOf: Date,
): Promise<TemperatureInputs> {
  if (series.temperatureSeriesId === null)
    return { usable: false, station: null, reason: 'the series has no linked temperature series', fallback: false };
  const { rows } = await db.query({ text: 'select id, key, name, unit from series where id = $1', values: [series.temperatureSeriesId] });
  const station = rows[0] as Station;
  const n = window.values.length;
  const firstMs = window.timestamps[0];
  const lastMs = window.timestamps[n - 1];
  const all = await readStationHourly(db, station.id, firstMs - HOUR_MS, lastMs + horizon * HOUR_MS);
  const training = all.slice(0, n);
  const coverage = 1 - countMissing(training) / n;
  if (coverage < MIN_TEMPERATURE_COVERAGE) {
    return {
      usable: false,
      station,
      reason: `${station.name} covers ${Math.round(coverage * 100)} % of the training hours (needs ${MIN_TEMPERATURE_COVERAGE * 100} %)`,
      fallback: true,
    };
  }
  fillInteriorGaps(training, Number.POSITIVE_INFINITY);
  fillEdges(training);
  // future[0] is the last training hour, future[k] the k-th forecast hour.
  const future = all.slice(n - 1);
  const issue = await latestIssue(db, station.id, asOf);
  let fromIssue = 0;
  if (issue) {
    for (let k = 1; k < future.length; k++) {
      const value = issue.values.get(lastMs + k * HOUR_MS);
      if (Number.isNaN(future[k]!) && value !== undefined) {
        future[k] = value;
        fromIssue++;
      }
    }
  }
  fillInteriorGaps(future, MAX_FUTURE_TEMPERATURE_GAP);
  const missingFuture = countMissing(future);
  const issued = issue ? `issued ${utcText(issue.issuedAt)}` : '';
  if (missingFuture > 0) {
    return {
      usable: false,
      station,
      reason: issue
        ? `the latest temperature forecast of ${station.name} (${issued}) leaves ${missingFuture} of the next ${horizon} hours uncovered: fitted without temperature`
        : `no temperature forecast of ${station.name} covers the next ${horizon} hours (${missingFuture} hours missing): fitted without temperature`,
      fallback: true,
    };
  }
  const forecastIssue =
    issue && fromIssue > 0
      ? { issuedAt: issue.issuedAt, hours: fromIssue, description: `forecast ${issued} (${fromIssue} of ${horizon} hours)` }
      : null;
  return { usable: true, station, training, future: future.slice(1), forecastIssue };
}

/** The newest forecast issue of a station issued at or before `asOf`, with its values by hour (epoch ms). */
async function latestIssue(db: Queryable, stationId: number, asOf: Date): Promise<{ issuedAt: Date; values: Map<number, number> } | null> {
  const { rows } = await db.query({
    text: `select (extract(epoch from ts) * 1000)::float8 as ts_ms, value, issued_at
             from temperature_forecasts
            where series_id = $1
              and issued_at = (select max(issued_at) from temperature_forecasts where series_id = $1 and issued_at <= $2)
            order by ts`,
    values: [stationId, asOf],
  });
  const typed = rows as Array<{ ts_ms: number; value: number; issued_at: Date }>;
  if (typed.length === 0) return null;
  return { issuedAt: new Date(typed[0]!.issued_at), values: new Map(typed.map((row) => [row.ts_ms, row.value])) };
}

/** "2026-12-01 06:00 UTC". */
function utcText(date: Date): string {
  return `${date.toISOString().slice(0, 16).replace('T', ' ')} UTC`;
}

/** Carries the first and last known values out over leading and trailing NaNs, in place. */
function fillEdges(values: Float64Array): void {
  const first = values.findIndex((v) => !Number.isNaN(v));
  for (let t = 0; t < first; t++) values[t] = values[first];
  let last = values.length - 1;
  while (last >= 0 && Number.isNaN(values[last])) last--;
  for (let t = last + 1; t < values.length; t++) values[t] = values[last];
}

/** A snake_case row with camelCase keys (model_specs read through plain SQL). */
function camelRow(row: Record<string, unknown>): Record<string, unknown> {
  return Object.fromEntries(
    Object.entries(row).map(([key, value]) => [key.replace(/_([a-z0-9])/g, (_, c: string) => c.toUpperCase()), value]),
  );
}

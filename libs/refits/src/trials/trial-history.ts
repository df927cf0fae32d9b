/**
 * The history a settings trial backtests on: the series' hourly values (read as a refit reads them:
 * validation estimates in place of flagged readings, excluded hours bridged) ending at the last whole
 * local day, long enough for the longer training window of the two sides plus the origins and the
 * week after the last one, and the linked station's observed temperatures over the same hours.
 *
 * Ending on a local day boundary puts every daily origin at local midnight, so each day-ahead window is
 * one whole local day and its daily peak is scored.
 */
import { TRIAL_MIN_TRAINING_HOURS, TRIAL_ORIGINS, trialHorizons } from '@loadwright/contracts';
import { localCalendar } from '@loadwright/forecasting';
import { countMissing, fillInteriorGaps } from '../fill-gaps';
import { RefitDataError } from '../refit-errors';
import { HOUR_MS, MAX_MISSING_SHARE, readHourly, readSeries, type Queryable, type RefitSeries, type Station } from '../series-window';

/** Least share of the hours the station must cover for its temperatures to be used (as in a refit). */
const MIN_TEMPERATURE_COVERAGE = 0.9;

/** Hours of history after the first origin: the origins a day apart, and a week after the last one. */
export const TRIAL_SCORED_SPAN_HOURS = (TRIAL_ORIGINS - 1) * 24 + trialHorizons.weekAhead;

/** Fewest hours a trial can run on: four weeks before the first origin and the scored span after it. */
export const TRIAL_MIN_HISTORY_HOURS = TRIAL_MIN_TRAINING_HOURS + TRIAL_SCORED_SPAN_HOURS;

/** The station's observed temperatures over the history's hours, or why they cannot be used. */
export type TrialTemperatures = { usable: true; station: Station; values: Float64Array } | { usable: false; reason: string };

/** What a trial backtests on. */
export interface TrialHistory {
  series: RefitSeries;
  /** UTC milliseconds of each hour, one hour apart, the last one closing a local day. */
  timestamps: Float64Array;
  values: Float64Array;
  /** Hours bridged by straight lines. */
  bridgedHours: number;
  temperature: TrialTemperatures;
}

/** Reads the trial's history for training windows of up to `windowDays` days; throws RefitDataError when too short or too gappy. */
export async function readTrialHistory(db: Queryable, seriesId: number, windowDays: number): Promise<TrialHistory> {
  const series = await readSeries(db, seriesId);
  if (series.intervalMinutes !== 60) {
    throw new RefitDataError(
      `${series.name} records every ${series.intervalMinutes} minutes; trials, like refits, model hourly series only.`,
    );
  }
  const { rows } = await db.query({
    text: 'select (extract(epoch from max(ts)) * 1000)::float8 as last from observations where series_id = $1',
    values: [series.id],
  });
  const last = (rows[0] as { last: number | null }).last;
  if (last === null) throw new RefitDataError(`${series.name} has no readings yet; a trial needs ${tooShortNeeds()}.`);
  const end = lastDayEnd(last, series.timeZone);
  const hours = windowDays * 24 + TRIAL_SCORED_SPAN_HOURS;
  const raw = await readHourly(db, series.id, end - hours * HOUR_MS, end);
  let first = 0;
  while (first < raw.length && Number.isNaN(raw[first])) first++;
  const values = raw.slice(first);
  const n = values.length;
  if (n < TRIAL_MIN_HISTORY_HOURS || Number.isNaN(values[n - 1])) {
    throw new RefitDataError(
      Number.isNaN(values[n - 1]) && n >= TRIAL_MIN_HISTORY_HOURS
        ? `${series.name} has no usable reading at the end of its last whole day; a trial scores forecasts against those hours.`
        : `${series.name} has ${n} hours of history up to its last whole day; a trial needs ${tooShortNeeds()}.`,
    );
  }
  const missing = countMissing(values);
  if (missing > MAX_MISSING_SHARE * n) {
    throw new RefitDataError(
      `${series.name} misses ${missing} of the ${n} hours a trial reads (${Math.round((100 * missing) / n)} %); at most ${MAX_MISSING_SHARE * 100} % can be bridged.`,
    );
  }
  const bridgedHours = fillInteriorGaps(values, Number.POSITIVE_INFINITY);
  // Grid hour i of `raw` is end − (hours − 1 − i) hours.
  const startMs = end - (hours - 1 - first) * HOUR_MS;
  const timestamps = Float64Array.from({ length: n }, (_, t) => startMs + t * HOUR_MS);
  const temperature = await readTrialTemperatures(db, series, timestamps);
  return { series, timestamps, values, bridgedHours, temperature };
}

/** What a trial needs, in words. */
function tooShortNeeds(): string {
  return (
    `at least ${TRIAL_MIN_HISTORY_HOURS} hours (${TRIAL_MIN_HISTORY_HOURS / 24} days): four weeks to fit on before the first ` +
    `of ${TRIAL_ORIGINS} daily origins, and a week after the last`
  );
}

/** The start of the last hour of the last whole local day at or before the reading stamped `lastMs`. */
function lastDayEnd(lastMs: number, timeZone: string): number {
  const hour = localCalendar([lastMs], timeZone).hourOfDay[0]!;
  return hour === 23 ? lastMs : lastMs - (hour + 1) * HOUR_MS;
}

/** The linked station's readings on the history's hours, bridged; unusable below 90 % coverage. */
async function readTrialTemperatures(db: Queryable, series: RefitSeries, timestamps: Float64Array): Promise<TrialTemperatures> {
  if (series.temperatureSeriesId === null) return { usable: false, reason: 'the series has no linked temperature series' };
  const { rows } = await db.query({ text: 'select id, key, name, unit from series where id = $1', values: [series.temperatureSeriesId] });
  const station = rows[0] as Station;
  const n = timestamps.length;
  const values = await readHourly(db, station.id, timestamps[0]! - HOUR_MS, timestamps[n - 1]!);
  const coverage = 1 - countMissing(values) / n;
  if (coverage < MIN_TEMPERATURE_COVERAGE) {
    return {
      usable: false,
      reason: `${station.name} covers ${Math.round(coverage * 100)} % of the trial's hours (needs ${MIN_TEMPERATURE_COVERAGE * 100} %)`,
    };
  }
  fillInteriorGaps(values, Number.POSITIVE_INFINITY);
  const known = values.findIndex((v) => !Number.isNaN(v));
  for (let t = 0; t < known; t++) values[t] = values[known]!;
  for (let t = 1; t < n; t++) if (Number.isNaN(values[t])) values[t] = values[t - 1]!;
  return { usable: true, station, values };
}

/**
 * Rolling-origin backtest: refit and forecast from several origins at the end of a series, then score every
 * forecast step by horizon and overall against the seasonal-naive benchmark.
 *
 * Method: rolling forecasting origin / time-series cross-validation (Tashman 2000, Int. J. Forecasting 16(4);
 *   Hyndman & Athanasopoulos 2021, FPP3 §5.10). With K origins, step s and horizon H on a series of length n, the
 *   training parts are the first n − H − (K − 1 − i)s values (i = 0..K−1), so the last origin leaves exactly H
 *   values to forecast. Each training part goes to the caller's forecaster; MAE, RMSE, MAPE, sMAPE and MASE
 *   (metrics.ts), coverage and Winkler scores of any intervals (interval-scores.ts), a benchmark (seasonal naive at
 *   the season by default, or like-day; benchmarks.ts) and skill scores (skill-score.ts) are computed per horizon h = 1..H and over all steps.
 * Conventions: MASE scales each origin's errors by the seasonal-naive MAE of THAT origin's training part
 *   (Hyndman & Koehler 2006), then averages; step defaults to H (non-overlapping windows, e.g. one day-ahead
 *   forecast per day); minTrain defaults to 2·season. Nulls follow metrics.ts (zero actuals give MAPE null).
 *   Daily-peak metrics (peak-metrics.ts) are added when `day` is given, from the whole days inside each window.
 * @throws ForecastingError 'invalid-argument' (bad settings, or a forecaster returning too few values or
 *   inconsistent interval levels); 'non-finite-input' (NaN or ±Infinity in x or from the forecaster);
 *   'too-few-observations' when the first origin would have fewer than
 *   minTrain values; any error the forecaster throws passes through unchanged.
 * References: Tashman (2000); Hyndman & Koehler (2006); Hyndman & Athanasopoulos (2021), FPP3 §5.10.
 */
import { ForecastingError, assertFinite } from '../core/errors';
import { likeDay, seasonalNaive, type LikeDayOptions } from './benchmarks';
import { coverage, winkler } from './interval-scores';
import { mae, maseScale, mape, rmse, smape } from './metrics';
import { dailyPeaks, type DailyPeak, type DayLayout } from './peak-metrics';
import { skillScore } from './skill-score';

/** An interval forecast as the forecaster returns it (core's PredictionInterval fits this shape). */
export interface BacktestInterval {
  /** Nominal coverage in percent. */
  level: number;
  lower: ArrayLike<number>;
  upper: ArrayLike<number>;
}

/** What a forecaster returns for one origin. */
export interface BacktestForecast {
  mean: ArrayLike<number>;
  intervals?: readonly BacktestInterval[];
}

/** Fits on `train` and forecasts `horizon` steps ahead. */
export type Forecaster = (train: Float64Array, horizon: number) => BacktestForecast;

/** Backtest settings. */
export interface BacktestOptions {
  /** Number of forecast origins K ≥ 1. */
  origins: number;
  /** Steps forecast from each origin. */
  horizon: number;
  /** Values between consecutive origins (default: horizon). */
  step?: number;
  /** Smallest training part allowed (default 2·season; at least season + 1). */
  minTrain?: number;
  forecaster: Forecaster;
  /** Seasonal period for MASE scaling and the seasonal-naive benchmark (1 = non-seasonal). */
  season: number;
  /** Day layout of the whole series x, to add daily-peak metrics. */
  day?: DayLayout;
  /** The benchmark for skill scores (default seasonal naive at `season`). */
  benchmark?: BacktestBenchmark;
}

/** Which benchmark the skill scores compare against. */
export type BacktestBenchmark = { kind: 'seasonal-naive' } | ({ kind: 'like-day' } & LikeDayOptions);

/** Coverage and Winkler score at one interval level. */
export interface IntervalMetrics {
  level: number;
  coverage: number;
  winkler: number;
}

/** Scores over a set of forecast steps. */
export interface BacktestMetrics {
  count: number;
  mae: number;
  rmse: number;
  mape: number | null;
  smape: number | null;
  mase: number | null;
  intervals: IntervalMetrics[];
  /** The benchmark's scores on the same steps. */
  benchmark: { mae: number; rmse: number; mase: number | null };
  /** 1 − score/benchmark score (null when the benchmark scored 0). */
  skill: { mae: number | null; rmse: number | null; mase: number | null };
}

/** Scores at one forecast step h. */
export interface HorizonMetrics extends BacktestMetrics {
  h: number;
}

/** Daily-peak scores over the whole days inside the forecast windows. */
export interface BacktestPeakMetrics {
  days: number;
  meanError: number;
  meanAbsoluteError: number;
  meanAbsoluteHours: number;
}

/** The backtest outcome. */
export interface BacktestResult {
  /** Training length at each origin. */
  origins: number[];
  horizon: number;
  step: number;
  season: number;
  perHorizon: HorizonMetrics[];
  overall: BacktestMetrics;
  peak: BacktestPeakMetrics | null;
  /** The forecasts and benchmark forecasts made at each origin. */
  forecasts: Array<{ origin: number; mean: Float64Array; benchmark: Float64Array }>;
}

/** One scored forecast step. */
interface StepRecord {
  actual: number;
  forecast: number;
  benchmark: number;
  scale: number;
  intervals: Map<number, [number, number]>;
}

/** Runs a rolling-origin backtest of `forecaster` on `x` (see the file comment). */
export function rollingOriginBacktest(x: ArrayLike<number>, options: BacktestOptions): BacktestResult {
  const fn = 'rollingOriginBacktest';
  const { origins: count, horizon, season } = options;
  const step = options.step ?? horizon;
  const minTrain = options.minTrain ?? 2 * season;
  for (const [name, value] of [
    ['origins', count],
    ['horizon', horizon],
    ['step', step],
    ['season', season],
    ['minTrain', minTrain],
  ] as const) {
    if (!Number.isInteger(value) || value < 1)
      throw new ForecastingError('invalid-argument', fn, `${name} must be a positive integer, got ${value}`);
  }
  if (minTrain <= season)
    throw new ForecastingError('invalid-argument', fn, `minTrain (${minTrain}) must exceed the season (${season}) for MASE scaling`);
  assertFinite(fn, x);
  const n = x.length;
  const origins = Array.from({ length: count }, (_, i) => n - horizon - (count - 1 - i) * step);
  if (origins[0] < minTrain) {
    throw new ForecastingError(
      'too-few-observations',
      fn,
      `needs ${minTrain + horizon + (count - 1) * step} values for ${count} origins, step ${step}, horizon ${horizon} and minTrain ${minTrain}, got ${n}`,
    );
  }

  const byHorizon: StepRecord[][] = Array.from({ length: horizon }, () => []);
  const forecasts: BacktestResult['forecasts'] = [];
  const peaks: DailyPeak[] = [];
  let levels: number[] | null = null;
  for (const origin of origins) {
    const train = Float64Array.from({ length: origin }, (_, i) => x[i]);
    const result = options.forecaster(Float64Array.from(train), horizon);
    const mean = takeFinite(fn, result.mean, horizon, `forecast mean at origin ${origin}`);
    const intervals = new Map<number, [Float64Array, Float64Array]>();
    for (const interval of result.intervals ?? []) {
      intervals.set(interval.level, [
        takeFinite(fn, interval.lower, horizon, `${interval.level} % lower bound at origin ${origin}`),
        takeFinite(fn, interval.upper, horizon, `${interval.level} % upper bound at origin ${origin}`),
      ]);
    }
    const theseLevels = [...intervals.keys()].sort((a, b) => a - b);
    if (levels === null) levels = theseLevels;
    else if (levels.join() !== theseLevels.join()) {
      throw new ForecastingError(
        'invalid-argument',
        fn,
        `the forecaster returned levels [${theseLevels}] at origin ${origin} but [${levels}] before`,
      );
    }
    const benchmark = benchmarkForecast(train, horizon, season, options.benchmark);
    const scale = maseScale(train, season);
    for (let h = 0; h < horizon; h++) {
      byHorizon[h].push({
        actual: x[origin + h],
        forecast: mean[h],
        benchmark: benchmark[h],
        scale,
        intervals: new Map([...intervals].map(([level, [lower, upper]]) => [level, [lower[h], upper[h]]])),
      });
    }
    forecasts.push({ origin, mean, benchmark });
    if (options.day) peaks.push(...windowPeaks(x, origin, mean, options.day));
  }

  return {
    origins,
    horizon,
    step,
    season,
    perHorizon: byHorizon.map((records, h) => ({ h: h + 1, ...summarise(records, levels ?? []) })),
    overall: summarise(byHorizon.flat(), levels ?? []),
    peak: peaks.length === 0 ? null : summarisePeaks(peaks),
    forecasts,
  };
}

/** The benchmark forecast from one origin. */
function benchmarkForecast(
  train: Float64Array,
  horizon: number,
  season: number,
  benchmark: BacktestBenchmark = { kind: 'seasonal-naive' },
): Float64Array {
  return benchmark.kind === 'like-day' ? likeDay(train, horizon, benchmark) : seasonalNaive(train, horizon, season).mean;
}

/** The first `horizon` values of a forecaster's array, checked for length and finiteness. */
function takeFinite(fn: string, values: ArrayLike<number>, horizon: number, what: string): Float64Array {
  if (values.length < horizon)
    throw new ForecastingError('invalid-argument', fn, `the forecaster returned ${values.length} values for the ${what}, needs ${horizon}`);
  const out = Float64Array.from({ length: horizon }, (_, i) => values[i]);
  assertFinite(fn, out, what);
  return out;
}

/** Scores a set of forecast steps. */
function summarise(records: StepRecord[], levels: number[]): BacktestMetrics {
  const actual = records.map((r) => r.actual);
  const forecast = records.map((r) => r.forecast);
  const benchmark = records.map((r) => r.benchmark);
  const scaledMae = (values: number[]) =>
    records.some((r) => r.scale === 0)
      ? null
      : records.reduce((s, r, i) => s + Math.abs(r.actual - values[i]) / r.scale, 0) / records.length;
  const model = { mae: mae(actual, forecast), rmse: rmse(actual, forecast), mase: scaledMae(forecast) };
  const bench = { mae: mae(actual, benchmark), rmse: rmse(actual, benchmark), mase: scaledMae(benchmark) };
  return {
    count: records.length,
    ...model,
    mape: mape(actual, forecast),
    smape: smape(actual, forecast),
    intervals: levels.map((level) => {
      const lower = records.map((r) => r.intervals.get(level)![0]);
      const upper = records.map((r) => r.intervals.get(level)![1]);
      return { level, coverage: coverage(actual, lower, upper), winkler: winkler(actual, lower, upper, level) };
    }),
    benchmark: bench,
    skill: {
      mae: skillScore(model.mae, bench.mae),
      rmse: skillScore(model.rmse, bench.rmse),
      mase: model.mase === null || bench.mase === null ? null : skillScore(model.mase, bench.mase),
    },
  };
}

/** Daily peaks of the whole days inside one forecast window (none when the window holds no whole day). */
function windowPeaks(x: ArrayLike<number>, origin: number, mean: Float64Array, day: DayLayout): DailyPeak[] {
  const perDay = day.periodsPerDay ?? 24;
  const firstDayStart = ((((day.firstDayStart ?? 0) - origin) % perDay) + perDay) % perDay;
  if (firstDayStart + perDay > mean.length) return [];
  const actual = Float64Array.from({ length: mean.length }, (_, i) => x[origin + i]);
  return dailyPeaks(actual, mean, { periodsPerDay: perDay, firstDayStart });
}

/** Mean peak error, mean absolute peak error and mean absolute time-of-peak error in hours. */
function summarisePeaks(days: DailyPeak[]): BacktestPeakMetrics {
  const mean = (f: (d: DailyPeak) => number) => days.reduce((s, d) => s + f(d), 0) / days.length;
  return {
    days: days.length,
    meanError: mean((d) => d.error),
    meanAbsoluteError: mean((d) => Math.abs(d.error)),
    meanAbsoluteHours: mean((d) => Math.abs(d.hourError)),
  };
}

/**
 * Benchmark forecasts every model must beat: seasonal naive and like-day.
 *
 * Seasonal naive at period m: f_{n+h} = y_{n+h−m(⌊(h−1)/m⌋+1)}, the value one season before (Hyndman &
 *   Athanasopoulos 2021, Forecasting: Principles and Practice, 3rd ed., §5.2), with standard errors as R's
 *   forecast::snaive: σ̂ = √mean_{t=m+1..n}(y_t − y_{t−m})² (no degrees-of-freedom correction) and
 *   se_h = σ̂ √(⌊(h−1)/m⌋ + 1) (FPP3 §5.5).
 * Like-day: the forecast for a target hour is the plain average of the same hour on the last k same weekdays
 *   available in the history, i.e. of y_{T−7d·j} for the k smallest j ≥ 1 with T − 7d·j inside the history,
 *   where d = periods per day (common practice in utility load forecasting, where it is also called a
 *   "similar-day" forecast; no holiday handling here).
 * Conventions: forecasts start right after the last history value; the shapes match core's PointForecast
 *   ({ mean, se }) so intervals come from predictionIntervals.
 * @throws ForecastingError 'too-few-observations' (history shorter than one period, or than k weeks for
 *   like-day), 'invalid-argument' (non-integer settings), 'non-finite-input'.
 * References: Hyndman & Athanasopoulos (2021), FPP3 §5.2 and §5.5; Hyndman & Khandakar (2008), J. Stat. Softw.
 *   27(3) (the forecast package).
 */
import { ForecastingError, assertFinite, assertLength } from '../core/errors';

/** A benchmark's point forecast, shaped like core's PointForecast. */
export interface BenchmarkForecast {
  mean: Float64Array;
  se: Float64Array;
}

/** Like-day settings. */
export interface LikeDayOptions {
  /** Periods per day (default 24). */
  periodsPerDay?: number;
  /** How many past same weekdays to average (default 4). */
  count?: number;
}

/** Throws unless `value` is a positive integer. */
function checkPositiveInteger(fn: string, name: string, value: number): void {
  if (!Number.isInteger(value) || value < 1)
    throw new ForecastingError('invalid-argument', fn, `${name} must be a positive integer, got ${value}`);
}

/** Seasonal-naive forecast at period m with forecast::snaive's standard errors. */
export function seasonalNaive(history: ArrayLike<number>, horizon: number, period: number): BenchmarkForecast {
  const fn = 'seasonalNaive';
  checkPositiveInteger(fn, 'horizon', horizon);
  checkPositiveInteger(fn, 'period', period);
  assertLength(fn, history, period + 1, `one period of ${period} plus one, for the standard error`);
  assertFinite(fn, history, 'history');
  const n = history.length;
  let ss = 0;
  for (let t = period; t < n; t++) ss += (history[t] - history[t - period]) ** 2;
  const sigma = Math.sqrt(ss / (n - period));
  const mean = new Float64Array(horizon);
  const se = new Float64Array(horizon);
  for (let h = 1; h <= horizon; h++) {
    const seasonsBack = Math.floor((h - 1) / period) + 1;
    mean[h - 1] = history[n + h - 1 - period * seasonsBack];
    se[h - 1] = sigma * Math.sqrt(seasonsBack);
  }
  return { mean, se };
}

/** Like-day forecast: average of the same hour on the last `count` same weekdays (see the file comment). */
export function likeDay(history: ArrayLike<number>, horizon: number, options: LikeDayOptions = {}): Float64Array {
  const fn = 'likeDay';
  const perDay = options.periodsPerDay ?? 24;
  const count = options.count ?? 4;
  checkPositiveInteger(fn, 'horizon', horizon);
  checkPositiveInteger(fn, 'periodsPerDay', perDay);
  checkPositiveInteger(fn, 'count', count);
  const week = 7 * perDay;
  assertFinite(fn, history, 'history');
  const n = history.length;
  const mean = new Float64Array(horizon);
  for (let h = 1; h <= horizon; h++) {
    const target = n + h - 1;
    const firstWeek = Math.ceil(h / week);
    const oldest = target - week * (firstWeek + count - 1);
    if (oldest < 0) {
      throw new ForecastingError(
        'too-few-observations',
        fn,
        `needs ${count} past same weekdays for step ${h}, i.e. at least ${n - oldest} values of history, got ${n}`,
      );
    }
    let s = 0;
    for (let j = firstWeek; j < firstWeek + count; j++) s += history[target - week * j];
    mean[h - 1] = s / count;
  }
  return mean;
}

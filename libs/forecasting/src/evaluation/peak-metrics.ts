/**
 * Daily-peak error and time-of-peak error for hourly (or finer) load: the quantities a planner checks first.
 *
 * Method (common practice in load forecasting; see Hong & Fan 2016, Int. J. Forecasting 32(3)): split actuals and forecasts into whole days; per day the peak is the maximum, the peak error is
 *   forecast peak − actual peak (positive = over-forecast), and the time-of-peak error is the forecast peak's
 *   time of day minus the actual peak's, in hours.
 * Conventions: `firstDayStart` is the index of the first value that opens a day (0 when the series starts at
 *   midnight); the partial days before it and after the last whole day are left out. Ties go to the earliest
 *   period. Hours = period-in-day × 24 / periodsPerDay, measured within the calendar day (not wrapped around
 *   midnight). Percent peak error is null when some actual peak is 0.
 * @throws ForecastingError 'too-few-observations' when no whole day fits; 'invalid-argument' for unequal lengths
 *   or bad day settings; 'non-finite-input'.
 * References: Hong & Fan (2016), Probabilistic electric load forecasting: a tutorial review, Int. J. Forecasting 32(3).
 */
import { ForecastingError } from '../core/errors';
import { checkAligned } from './paired-input';

/** Where days start in the arrays and how many periods a day has. */
export interface DayLayout {
  /** Periods per day (24 for hourly data, the default). */
  periodsPerDay?: number;
  /** Index of the first value that opens a day (default 0). */
  firstDayStart?: number;
}

/** One whole day's peaks. */
export interface DailyPeak {
  /** Index of the day's first value in the input arrays. */
  start: number;
  actualPeak: number;
  forecastPeak: number;
  /** forecastPeak − actualPeak. */
  error: number;
  /** Hour of day of the actual and forecast peaks (0 = the first period of the day). */
  actualHour: number;
  forecastHour: number;
  /** forecastHour − actualHour. */
  hourError: number;
}

/** Summary of daily peak errors over whole days. */
export interface DailyPeakError {
  days: DailyPeak[];
  /** Mean of forecast peak − actual peak (bias). */
  meanError: number;
  /** Mean |forecast peak − actual peak|. */
  meanAbsoluteError: number;
  /** Mean |peak error| / actual peak in percent, or null when some actual peak is 0. */
  meanAbsolutePercentageError: number | null;
}

/** Summary of time-of-peak errors over whole days, in hours. */
export interface TimeOfPeakError {
  days: DailyPeak[];
  /** Mean |forecast peak hour − actual peak hour|. */
  meanAbsoluteHours: number;
  /** Share of days whose peak hour was forecast exactly. */
  exactShare: number;
}

/** Per-day peaks of actuals and forecasts over whole days. */
export function dailyPeaks(actual: ArrayLike<number>, forecast: ArrayLike<number>, layout: DayLayout = {}): DailyPeak[] {
  const fn = 'dailyPeaks';
  const n = checkAligned(fn, { actual, forecast });
  const perDay = layout.periodsPerDay ?? 24;
  const first = layout.firstDayStart ?? 0;
  if (!Number.isInteger(perDay) || perDay < 1)
    throw new ForecastingError('invalid-argument', fn, `periodsPerDay must be a positive integer, got ${perDay}`);
  if (!Number.isInteger(first) || first < 0 || first >= perDay) {
    throw new ForecastingError('invalid-argument', fn, `firstDayStart must be an integer in [0, ${perDay}), got ${first}`);
  }
  const days: DailyPeak[] = [];
  for (let start = first; start + perDay <= n; start += perDay) {
    let a = start;
    let f = start;
    for (let i = start + 1; i < start + perDay; i++) {
      if (actual[i] > actual[a]) a = i;
      if (forecast[i] > forecast[f]) f = i;
    }
    const actualHour = ((a - start) * 24) / perDay;
    const forecastHour = ((f - start) * 24) / perDay;
    days.push({
      start,
      actualPeak: actual[a],
      forecastPeak: forecast[f],
      error: forecast[f] - actual[a],
      actualHour,
      forecastHour,
      hourError: forecastHour - actualHour,
    });
  }
  if (days.length === 0) {
    throw new ForecastingError('too-few-observations', fn, `needs one whole day of ${perDay} values from index ${first}, got ${n} values`);
  }
  return days;
}

/** Daily-peak error: bias, MAE and MAPE of the daily maxima (see the file comment). */
export function dailyPeakError(actual: ArrayLike<number>, forecast: ArrayLike<number>, layout: DayLayout = {}): DailyPeakError {
  const days = dailyPeaks(actual, forecast, layout);
  let bias = 0;
  let absolute = 0;
  let percent: number | null = 0;
  for (const day of days) {
    bias += day.error;
    absolute += Math.abs(day.error);
    percent = percent === null || day.actualPeak === 0 ? null : percent + Math.abs((100 * day.error) / day.actualPeak);
  }
  return {
    days,
    meanError: bias / days.length,
    meanAbsoluteError: absolute / days.length,
    meanAbsolutePercentageError: percent === null ? null : percent / days.length,
  };
}

/** Time-of-peak error in hours: mean |forecast peak hour − actual peak hour| and the share hit exactly. */
export function timeOfPeakError(actual: ArrayLike<number>, forecast: ArrayLike<number>, layout: DayLayout = {}): TimeOfPeakError {
  const days = dailyPeaks(actual, forecast, layout);
  const absolute = days.reduce((s, d) => s + Math.abs(d.hourError), 0);
  const exact = days.filter((d) => d.hourError === 0).length;
  return { days, meanAbsoluteHours: absolute / days.length, exactShare: exact / days.length };
}

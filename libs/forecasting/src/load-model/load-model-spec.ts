import type { LocalCalendar } from '../seasonal/local-calendar';
import type { FitMethod, FitResult } from '../core/types';
import type { PredictionInterval } from '../forecast/intervals';
import type { HolidaySpec } from '../seasonal/holiday-calendar';
import type { ProfileForm, SeasonalProfile } from '../seasonal/seasonal-profile';
import type { BalancePoints } from './degree-hours';
import type { PenaltySelection } from '../regularised/regularised-fit';

/** Estimators of the ARMA part, plus the seasonal-naive benchmark as a model of its own. */
export type LoadModelMethod = FitMethod | 'seasonal-naive';

/** How the daily/weekly cycle is handled before the ARMA part. */
export type SeasonalSpec =
  { kind: 'none' } | { kind: 'profile'; period: 24 | 168; form: ProfileForm } | { kind: 'difference'; lag: 24 | 168 };

/** Everything the nightly refit needs to know to fit one series. */
export interface LoadModelSpec {
  method: LoadModelMethod;
  /** AR order (for ridge/lasso without `lags`: lags 1..p). */
  p: number;
  /** MA order; only 'nls' accepts q > 0. */
  q: number;
  /** Lag set for ridge/lasso, e.g. 1..48 and 168. */
  lags?: number[];
  /** Fixed ridge/lasso penalty; chosen by `select` when absent. */
  lambda?: number;
  /** Penalty choice for ridge/lasso (default 'bic'). */
  select?: PenaltySelection;
  seasonal: SeasonalSpec;
  /** Model log(load); forecasts return to load through the lognormal (see forecastLoadModel). */
  log: boolean;
  /** Degree-hour regressors from the temperature series, or none. */
  temperature: BalancePoints | null;
  /** Saturday and Sunday-or-holiday indicators (weekday baseline). */
  dayTypes: boolean;
  /** Holiday calendar, or none. */
  holidays: HolidaySpec | null;
  /** IANA zone of the series, e.g. "America/Chicago": slots, day types and holidays are local. */
  timeZone: string;
}

/** An hourly load series with optional hourly temperature on the same timestamps. */
export interface LoadSeriesData {
  /** UTC epoch milliseconds, hourly, strictly increasing by 3 600 000. */
  timestamps: Float64Array;
  values: Float64Array;
  temperature?: Float64Array;
  /** The local calendar of `timestamps`, when the caller has it already; used only if made in the spec's zone (calendarOf). */
  calendar?: LocalCalendar;
}

/** Inputs known (or forecast) for the forecast hours. */
export interface FutureInputs {
  /** Temperature for hours 1..horizon after the last observation (weather forecast). */
  temperature?: Float64Array;
}

/** Regression coefficients of the exogenous part. */
export interface RegressionPart {
  /** Regressor names in column order ('heating-degree-hours', 'cooling-degree-hours', 'saturday', 'sunday-holiday', 'holiday'). */
  names: string[];
  coefficients: number[];
  /** GLS standard errors (ARMA parameters held fixed), null when a column was dropped. */
  stderr: Array<number | null>;
  /** Regressors left out because they were identically zero in training (e.g. no hour below the heating base). */
  dropped: string[];
  /** Iterated feasible GLS passes and whether the coefficients settled. */
  iterations: number;
  converged: boolean;
}

/** A fitted load model: the estimated pieces and what forecasting needs. */
export interface FittedLoadModel {
  spec: LoadModelSpec;
  /** UTC epoch ms of the last training hour. */
  lastTimestamp: number;
  /** The ARMA part fitted to the remainder, or null for seasonal naive. */
  arma: FitResult | null;
  regression: RegressionPart;
  /** The seasonal profile (on the log scale when `log`), or null. */
  profile: SeasonalProfile | null;
  /** One-step residuals on the modelling scale (ARMA residuals, or the seasonal-naive errors). */
  residuals: Float64Array;
  /** Training series after the log transform (if any): the base of differencing and seasonal naive. */
  transformed: Float64Array;
  /** Training regressor columns (names as `regression.names`), needed to difference future regressors. */
  regressors: Float64Array[];
  /** The series the ARMA part was fitted to. */
  remainder: Float64Array;
  /** Seasonal naive: its period and the in-sample mean squared seasonal-naive error. */
  seasonalNaive: { period: number; sigma2: number } | null;
}

/** Forecasts for the hours after the training data, on the load scale. */
export interface LoadForecast {
  timestamps: Float64Array;
  /** Conditional mean (with `log`: the bias-adjusted lognormal mean exp(m + s²/2)). */
  mean: Float64Array;
  /** Forecast standard error (with `log`: the lognormal standard deviation). */
  se: Float64Array;
  /** With `log`: the median exp(m), which the intervals surround; otherwise equal to `mean`. */
  median: Float64Array;
  intervals: PredictionInterval[];
  /** Centre and standard error on the modelling scale (log load for a model on logs), which the Gaussian bands surround. */
  modelScale: { mean: Float64Array; se: Float64Array };
}

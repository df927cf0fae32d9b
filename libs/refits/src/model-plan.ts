/**
 * From a series' settings to the engine's LoadModelSpec: the shared design (seasonal step, log,
 * temperature and calendar regressors) and, for a fixed method, its estimator and orders.
 */
import type { ModelSettingsRequest } from '@loadwright/contracts';
import type { BalancePoints, HolidaySpec, LoadModelSpec, SeasonalSpec } from '@loadwright/forecasting';

/** The design every candidate shares: everything but the estimator and its orders. */
export type ModelDesign = Omit<LoadModelSpec, 'method' | 'p' | 'q' | 'lags' | 'lambda' | 'select'>;

/** Balance points when the settings leave them empty: 15.5 °C and 22 °C, or the same in °F. */
export function defaultBalancePoints(unit: string): BalancePoints {
  return unit === 'degF' ? { heatingBase: 59.9, coolingBase: 71.6 } : { heatingBase: 15.5, coolingBase: 22 };
}

/**
 * The design of `settings`. `temperatureUnit` is the station's unit when its temperatures can be used,
 * null otherwise; `holidays` is the organisation's calendar (null without a holiday country). Calendar
 * regressors: with an hour-of-week profile (which carries the weekday pattern) a holiday indicator alone,
 * otherwise Saturday and Sunday-or-holiday indicators.
 */
export function modelDesign(
  settings: ModelSettingsRequest,
  timeZone: string,
  temperatureUnit: string | null,
  holidays: HolidaySpec | null,
): ModelDesign {
  const seasonal: SeasonalSpec =
    settings.seasonal.kind === 'none'
      ? { kind: 'none' }
      : settings.seasonal.kind === 'difference'
        ? { kind: 'difference', lag: settings.seasonal.lag }
        : { kind: 'profile', period: settings.seasonal.slot === 'hour-of-day' ? 24 : 168, form: settings.seasonal.form };
  const weeklyProfile = seasonal.kind === 'profile' && seasonal.period === 168;
  const defaults = temperatureUnit ? defaultBalancePoints(temperatureUnit) : null;
  return {
    seasonal,
    log: settings.log,
    temperature: defaults
      ? {
          heatingBase: settings.temperature.heatingBase ?? defaults.heatingBase,
          coolingBase: settings.temperature.coolingBase ?? defaults.coolingBase,
        }
      : null,
    dayTypes: settings.dayTypes && !weeklyProfile,
    holidays: settings.dayTypes ? holidays : null,
    timeZone,
  };
}

/** Seasonal naive's spec: last week's value (or yesterday's with 24-hour differencing), no regressors. */
export function seasonalNaiveSpec(design: ModelDesign): LoadModelSpec {
  return {
    ...design,
    method: 'seasonal-naive',
    p: 0,
    q: 0,
    seasonal: design.seasonal.kind === 'difference' ? design.seasonal : { kind: 'none' },
    temperature: null,
    dayTypes: false,
    holidays: null,
  };
}

/** Lag set of ridge/lasso: 1..p plus the extra lags, sorted and unique. */
export function regularisedLags(p: number, extraLags: readonly number[]): number[] {
  return [...new Set([...Array.from({ length: p }, (_, i) => i + 1), ...extraLags])].sort((a, b) => a - b);
}

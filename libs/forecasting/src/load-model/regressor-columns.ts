import { ForecastingError } from '../core/errors';
import { dayTypeIndicators, holidayIndicator } from '../seasonal/day-type';
import { holidayDates, yearsOf } from '../seasonal/holiday-calendar';
import type { LocalCalendar } from '../seasonal/local-calendar';
import { degreeHours } from './degree-hours';
import type { LoadModelSpec } from './load-model-spec';

/** Named exogenous regressor columns, one value per hour. */
export interface RegressorColumns {
  names: string[];
  columns: Float64Array[];
}

/**
 * Builds the exogenous regressors the spec asks for, in a fixed order: heating and cooling degree-hours
 * (needs `temperature`), then Saturday and Sunday-or-holiday indicators (`dayTypes`; holidays from
 * `holidays` count as Sunday), or a lone holiday indicator when only `holidays` is set. No constant
 * column: the level belongs to the ARMA mean.
 *
 * @throws ForecastingError 'invalid-argument' when temperature is missing or of the wrong length, or when
 *   day types meet an hour-of-week profile (the profile already carries the weekday pattern, so the two
 *   would be collinear).
 */
export function regressorColumns(
  spec: LoadModelSpec,
  calendar: LocalCalendar,
  temperature: ArrayLike<number> | undefined,
): RegressorColumns {
  const fn = 'regressorColumns';
  const n = calendar.localDate.length;
  const names: string[] = [];
  const columns: Float64Array[] = [];
  if (spec.temperature) {
    if (!temperature || temperature.length < n) {
      throw new ForecastingError(
        'invalid-argument',
        fn,
        `temperature regressors need ${n} hourly temperatures, got ${temperature?.length ?? 0}`,
      );
    }
    const { heating, cooling } = degreeHours(Array.prototype.slice.call(temperature, 0, n) as number[], spec.temperature);
    names.push('heating-degree-hours', 'cooling-degree-hours');
    columns.push(heating, cooling);
  }
  if (spec.dayTypes && spec.seasonal.kind === 'profile' && spec.seasonal.period === 168) {
    throw new ForecastingError(
      'invalid-argument',
      fn,
      'day types duplicate the hour-of-week profile: use a 24-hour profile with day types, or holidays alone',
    );
  }
  const holidays = spec.holidays ? holidayDates(spec.holidays, yearsOf(calendar.localDate)) : null;
  if (spec.dayTypes) {
    const { saturday, sundayHoliday } = dayTypeIndicators(calendar, holidays);
    names.push('saturday', 'sunday-holiday');
    columns.push(saturday, sundayHoliday);
  } else if (holidays) {
    names.push('holiday');
    columns.push(holidayIndicator(calendar, holidays));
  }
  return { names, columns };
}

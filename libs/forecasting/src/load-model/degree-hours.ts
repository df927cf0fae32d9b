import { ForecastingError, assertFinite } from '../core/errors';

/**
 * Default balance points for a temperature series in °C: heating below 15.5 °C, cooling above 22 °C.
 * 15.5 °C (≈ 60 °F) is the usual heating base of degree-day statistics and 22 °C a usual cooling base;
 * common practice, tune per system (balance points differ by climate and building stock).
 */
export const DEFAULT_HEATING_BASE_C = 15.5;
/** See DEFAULT_HEATING_BASE_C. */
export const DEFAULT_COOLING_BASE_C = 22;

/** Balance points in the unit of the temperature series. */
export interface BalancePoints {
  heatingBase: number;
  coolingBase: number;
}

/**
 * Heating and cooling degree-hours from an hourly temperature series:
 * HDH_t = max(0, heatingBase − T_t), CDH_t = max(0, T_t − coolingBase) (the degree-day construction applied
 * per hour; common practice in load forecasting, e.g. Hong & Fan 2016, Int. J. Forecasting 32(3) §3).
 *
 * @throws ForecastingError 'non-finite-input' for a missing temperature, 'invalid-argument' when
 *   heatingBase > coolingBase.
 */
export function degreeHours(temperature: ArrayLike<number>, balance: BalancePoints): { heating: Float64Array; cooling: Float64Array } {
  const fn = 'degreeHours';
  assertFinite(fn, temperature, 'temperature');
  if (!Number.isFinite(balance.heatingBase) || !Number.isFinite(balance.coolingBase) || balance.heatingBase > balance.coolingBase) {
    throw new ForecastingError(
      'invalid-argument',
      fn,
      `needs finite balance points with heatingBase ≤ coolingBase, got ${balance.heatingBase} and ${balance.coolingBase}`,
    );
  }
  const heating = new Float64Array(temperature.length);
  const cooling = new Float64Array(temperature.length);
  for (let t = 0; t < temperature.length; t++) {
    heating[t] = Math.max(0, balance.heatingBase - temperature[t]);
    cooling[t] = Math.max(0, temperature[t] - balance.coolingBase);
  }
  return { heating, cooling };
}

import { describe, expect, it } from 'vitest';
import { ForecastingError } from '../core/errors';
import { DEFAULT_COOLING_BASE_C, DEFAULT_HEATING_BASE_C, degreeHours } from './degree-hours';

describe('degreeHours', () => {
  it('computes HDH = max(0, base_h − T) and CDH = max(0, T − base_c) (hand values)', () => {
    const { heating, cooling } = degreeHours([-4.5, 15.5, 18, 22, 30.25], {
      heatingBase: DEFAULT_HEATING_BASE_C,
      coolingBase: DEFAULT_COOLING_BASE_C,
    });
    expect(Array.from(heating)).toEqual([20, 0, 0, 0, 0]);
    expect(Array.from(cooling)).toEqual([0, 0, 0, 0, 8.25]);
  });

  it('refuses missing temperatures and crossed balance points', () => {
    expect(() => degreeHours([10, Number.NaN], { heatingBase: 15.5, coolingBase: 22 })).toThrow(ForecastingError);
    expect(() => degreeHours([10], { heatingBase: 25, coolingBase: 22 })).toThrow(/heatingBase/);
  });
});

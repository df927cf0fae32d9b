import { describe, expect, it } from 'vitest';
import { ForecastingError } from '../core/errors';
import { integrateSeasonalDifference, seasonalDifference } from './seasonal-difference';

describe('seasonalDifference and integrateSeasonalDifference', () => {
  it('differences at the lag (hand example)', () => {
    expect(Array.from(seasonalDifference([1, 2, 4, 7, 11], 2))).toEqual([3, 5, 7]);
  });

  it('integrates differenced forecasts back to levels (inverse of differencing)', () => {
    const lag = 24;
    const full = Float64Array.from({ length: 24 * 9 }, (_, t) => 50 + 10 * Math.cos(t / 3) + t * 0.01);
    const history = full.subarray(0, 24 * 7);
    const future = full.subarray(24 * 7);
    const diffs = seasonalDifference(full, lag).subarray(history.length - lag);
    const rebuilt = integrateSeasonalDifference(history, diffs, lag);
    rebuilt.forEach((v, h) => expect(v).toBeCloseTo(future[h], 10));
  });

  it('refuses short histories and bad lags', () => {
    expect(() => seasonalDifference([1, 2], 24)).toThrow(ForecastingError);
    expect(() => integrateSeasonalDifference([1, 2], [0], 24)).toThrow(ForecastingError);
    expect(() => seasonalDifference([1, 2, 3], 0)).toThrow(/lag/);
  });
});

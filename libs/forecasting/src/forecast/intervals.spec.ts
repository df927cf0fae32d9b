import { describe, expect, it } from 'vitest';
import lh from '../../../../fixtures/reference/ref/lh.json';
import { predictionIntervals } from './intervals';

describe('predictionIntervals', () => {
  const forecast = { mean: Float64Array.from([10, 20]), se: Float64Array.from([1, 2]) };

  it('uses z = qnorm(1/2 + level/200): the z80 and z95 stored with R predict() (fixtures/reference/ref/lh.json forecasts.ar2_ml)', () => {
    const [i80, i95] = predictionIntervals(forecast, [80, 95]);
    expect(i80.level).toBe(80);
    expect(i80.upper[1] - 20).toBeCloseTo(2 * lh.forecasts.ar2_ml.z80, 13);
    expect(20 - i95.lower[1]).toBeCloseTo(2 * lh.forecasts.ar2_ml.z95, 13);
  });

  it('accepts any level in (0, 100), and wider levels give wider intervals', () => {
    const [a, b, c] = predictionIntervals(forecast, [50, 99.5, 2.5]);
    expect(a.upper[0] - a.lower[0]).toBeLessThan(b.upper[0] - b.lower[0]);
    expect(c.upper[0] - c.lower[0]).toBeLessThan(a.upper[0] - a.lower[0]);
    // 50 %: z = qnorm(0.75) = 0.674489750196082 (R 4.2.2, digits = 15).
    expect(a.upper[0] - 10).toBeCloseTo(0.674489750196082, 14);
  });

  it('refuses levels outside (0, 100)', () => {
    for (const level of [0, 100, -5, 150, Number.NaN]) {
      expect(() => predictionIntervals(forecast, [level])).toThrow(expect.objectContaining({ code: 'invalid-argument' }));
    }
  });
});

/**
 * Rolling-origin backtests.
 * - One origin on USAccDeaths with a seasonal-naive forecaster reproduces R's hold-out scores
 *   (fixtures/reference/ref/USAccDeaths.json `seasonal.holdout.snaive.accuracy["Test set"]`, from
 *   `forecast::accuracy(fc_snaive, test)`), relative 1e-12; skill against the same benchmark is exactly 0.
 * - A straight line 1..20 with a last-value forecaster is hand-computed (arithmetic in the comments).
 * - Daily peaks on a synthetic hourly series whose daily shape repeats and whose level rises 0.5 a day.
 */
import { describe, expect, it } from 'vitest';
import { normalQuantile } from '../core/normal';
import { rollingOriginBacktest, type Forecaster } from './backtest';
import { seasonalNaive } from './benchmarks';
import { holdout, period, series } from './usaccdeaths.testing';

/** Seasonal naive at `m` with its 95 % interval, as a backtest forecaster. */
const seasonalNaiveForecaster =
  (m: number): Forecaster =>
  (train, horizon) => {
    const { mean, se } = seasonalNaive(train, horizon, m);
    const z = normalQuantile(0.975);
    return { mean, intervals: [{ level: 95, lower: mean.map((v, i) => v - z * se[i]), upper: mean.map((v, i) => v + z * se[i]) }] };
  };

/** Repeats the last training value. */
const lastValue: Forecaster = (train, horizon) => ({
  mean: new Float64Array(horizon).fill(train[train.length - 1]),
  intervals: [
    {
      level: 80,
      lower: new Float64Array(horizon).fill(train[train.length - 1] - 1.5),
      upper: new Float64Array(horizon).fill(train[train.length - 1] + 1.5),
    },
  ],
});

describe('rollingOriginBacktest', () => {
  it('reproduces forecast::accuracy for the seasonal-naive USAccDeaths hold-out', () => {
    const result = rollingOriginBacktest(series, { origins: 1, horizon: 12, season: period, forecaster: seasonalNaiveForecaster(period) });
    const row = holdout.snaive.accuracy['Test set'];
    expect(result.origins).toEqual([60]);
    expect(Array.from(result.forecasts[0].mean)).toEqual(holdout.snaive.mean);
    const rel = (a: number | null, b: number) => Math.abs((a ?? Number.NaN) / b - 1);
    expect(rel(result.overall.mae, row.MAE)).toBeLessThan(1e-12);
    expect(rel(result.overall.rmse, row.RMSE)).toBeLessThan(1e-12);
    expect(rel(result.overall.mape, row.MAPE)).toBeLessThan(1e-12);
    expect(rel(result.overall.mase, row.MASE)).toBeLessThan(1e-12);
    expect(result.overall.skill.mae).toBe(0);
    // Coverage of R's own 95 % bounds: count test values inside [lower95, upper95] from the reference file.
    const inside = holdout.test.filter((y: number, i: number) => y >= holdout.snaive.lower95[i] && y <= holdout.snaive.upper95[i]).length;
    expect(result.overall.intervals[0].coverage).toBe(inside / 12);
    expect(result.perHorizon).toHaveLength(12);
    expect(result.perHorizon[0].mae).toBe(Math.abs(holdout.test[0] - holdout.snaive.mean[0]));
  });

  it('scores a last-value forecaster on a straight line by hand', () => {
    // x = 1..20; origins 3, horizon 2, step 1 → training lengths 20 − 2 − (2 − i) = 16, 17, 18.
    // At training length o the last value is o; actuals are o + 1 and o + 2, so errors are 1 at h = 1, 2 at h = 2.
    const x = Array.from({ length: 20 }, (_, t) => t + 1);
    const result = rollingOriginBacktest(x, { origins: 3, horizon: 2, step: 1, season: 1, minTrain: 2, forecaster: lastValue });
    expect(result.origins).toEqual([16, 17, 18]);
    const [h1, h2] = result.perHorizon;
    expect([h1.mae, h1.rmse, h2.mae, h2.rmse]).toEqual([1, 1, 2, 2]);
    // MASE: every training part has mean |y_t − y_{t−1}| = 1, so MASE = MAE.
    expect([h1.mase, h2.mase]).toEqual([1, 2]);
    // MAPE at h = 1: actuals 17, 18, 19 → (100/17 + 100/18 + 100/19)/3.
    expect(h1.mape).toBeCloseTo((100 / 17 + 100 / 18 + 100 / 19) / 3, 12);
    // Overall: MAE (1 + 2)/2 = 1.5, RMSE √((1 + 4)/2) = √2.5.
    expect(result.overall.mae).toBe(1.5);
    expect(result.overall.rmse).toBeCloseTo(Math.sqrt(2.5), 14);
    // 80 % interval last ± 1.5: α = 0.2, 2/α = 10. h = 1 covered, width 3; h = 2 misses by 0.5 → 3 + 10·0.5 = 8.
    expect(h1.intervals).toEqual([{ level: 80, coverage: 1, winkler: 3 }]);
    expect(h2.intervals).toEqual([{ level: 80, coverage: 0, winkler: 8 }]);
    // The benchmark (seasonal naive at season 1) is the same forecaster: skill 0.
    expect(result.overall.skill).toEqual({ mae: 0, rmse: 0, mase: 0 });
  });

  it('scores daily peaks inside the windows', () => {
    // Hourly: level 100 + 0.5·day, daily shape peaking at 14:00. Seasonal naive at 24 repeats yesterday,
    // so each forecast day peaks at the right hour but 0.5 too low.
    const x = Array.from({ length: 24 * 10 }, (_, t) => 100 + 0.5 * Math.floor(t / 24) + 10 * Math.exp(-(((t % 24) - 14) ** 2) / 8));
    const result = rollingOriginBacktest(x, {
      origins: 3,
      horizon: 24,
      season: 24,
      forecaster: seasonalNaiveForecaster(24),
      day: { periodsPerDay: 24 },
    });
    expect(result.peak!.days).toBe(3);
    expect(result.peak!.meanError).toBeCloseTo(-0.5, 12);
    expect(result.peak!.meanAbsoluteHours).toBe(0);
    // Windows that start mid-day hold no whole day: no peak metrics.
    const shifted = rollingOriginBacktest(x, {
      origins: 3,
      horizon: 24,
      season: 24,
      forecaster: seasonalNaiveForecaster(24),
      day: { firstDayStart: 5 },
    });
    expect(shifted.peak).toBeNull();
  });

  it('compares against like-day when asked', () => {
    // Hourly series with a weekly pattern: like-day with k = 1 equals seasonal naive at 168, so a seasonal-naive-168
    // forecaster has skill exactly 0 against it, and skill 1 − MAE/MAE_likeDay against the 4-week like-day average.
    const x = Array.from(
      { length: 24 * 7 * 6 },
      (_, t) => 50 + 10 * Math.sin((2 * Math.PI * t) / 24) + 5 * (Math.floor(t / 24) % 7 === 6 ? -1 : 0) + (t % 5),
    );
    const forecaster = seasonalNaiveForecaster(168);
    const one = rollingOriginBacktest(x, { origins: 2, horizon: 24, season: 24, forecaster, benchmark: { kind: 'like-day', count: 1 } });
    expect(one.overall.skill.mae).toBe(0);
    const four = rollingOriginBacktest(x, { origins: 2, horizon: 24, season: 24, forecaster, benchmark: { kind: 'like-day', count: 4 } });
    const likeDayMae = four.overall.benchmark.mae;
    expect(four.overall.skill.mae).toBeCloseTo(1 - four.overall.mae / likeDayMae, 14);
  });

  it('refuses too little data and misbehaving forecasters', () => {
    const x = Array.from({ length: 30 }, (_, t) => t + 1);
    expect(() => rollingOriginBacktest(x, { origins: 10, horizon: 5, season: 1, forecaster: lastValue })).toThrowError(
      expect.objectContaining({ code: 'too-few-observations' }),
    );
    expect(() => rollingOriginBacktest(x, { origins: 2, horizon: 3, season: 1, forecaster: () => ({ mean: [1] }) })).toThrowError(
      expect.objectContaining({ code: 'invalid-argument' }),
    );
    expect(() => rollingOriginBacktest(x, { origins: 2, horizon: 1, season: 1, forecaster: () => ({ mean: [Number.NaN] }) })).toThrowError(
      expect.objectContaining({ code: 'non-finite-input' }),
    );
    let call = 0;
    const flaky: Forecaster = (train, h) => (call++ === 0 ? lastValue(train, h) : { mean: new Float64Array(h).fill(1) });
    expect(() => rollingOriginBacktest(x, { origins: 2, horizon: 1, season: 1, forecaster: flaky })).toThrowError(/levels/);
    expect(() => rollingOriginBacktest(x, { origins: 2, horizon: 1, season: 3, minTrain: 3, forecaster: lastValue })).toThrowError(
      /must exceed the season/,
    );
  });
});

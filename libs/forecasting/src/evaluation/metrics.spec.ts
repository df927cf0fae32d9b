/**
 * Accuracy metrics against R's forecast::accuracy on the USAccDeaths hold-out
 * (fixtures/reference/ref/USAccDeaths.json `seasonal.holdout`: `forecast::accuracy(fc_arima, test)` and
 * `forecast::accuracy(fc_snaive, test)` "Test set" rows, and the file's manual recomputation `manual_test`).
 * R writes 15 significant digits, so relative 1e-12. MASE scale: `mase_scale` (mean(abs(diff(train, lag = 12)))).
 * The `accuracy_pitfall` entry records R's lag-1 scaling when test is a plain numeric vector: reproduced with
 * period 1. sMAPE and the null cases are hand-computed below.
 */
import { describe, expect, it } from 'vitest';
import { ForecastingError } from '../core/errors';
import { mae, mape, mase, maseScale, rmse, smape } from './metrics';
import { holdout, period, training } from './usaccdeaths.testing';

const relative = (a: number | null, b: number) => Math.abs((a ?? Number.NaN) - b) / Math.abs(b);

describe('accuracy metrics', () => {
  it('uses the training data R used and the same test values', () => {
    expect(training.length).toBe(holdout.train_n);
    expect(holdout.test.length).toBe(holdout.test_n);
  });

  for (const model of ['arima', 'snaive'] as const) {
    it(`match forecast::accuracy for the ${model} hold-out forecast`, () => {
      const test: number[] = holdout.test;
      const forecast: number[] = holdout[model].mean;
      const row = holdout[model].accuracy['Test set'];
      expect(relative(mae(test, forecast), row.MAE)).toBeLessThan(1e-12);
      expect(relative(rmse(test, forecast), row.RMSE)).toBeLessThan(1e-12);
      expect(relative(mape(test, forecast), row.MAPE)).toBeLessThan(1e-12);
      expect(relative(mase(test, forecast, training, period), row.MASE)).toBeLessThan(1e-12);
      const manual = holdout[model].manual_test;
      expect(relative(mae(test, forecast), manual.MAE)).toBeLessThan(1e-12);
      expect(relative(rmse(test, forecast), manual.RMSE)).toBeLessThan(1e-12);
      expect(relative(mape(test, forecast), manual.MAPE)).toBeLessThan(1e-12);
      expect(relative(mase(test, forecast, training, period), manual.MASE)).toBeLessThan(1e-12);
    });
  }

  it('scales MASE by the in-sample seasonal-naive MAE of the training part', () => {
    expect(maseScale(training, period)).toBe(holdout.mase_scale); // 481.6875 = mean |y_t − y_{t−12}| over 48 pairs
  });

  it("reproduces R's lag-1 scaling pitfall only when asked for period 1", () => {
    const pitfall = holdout.accuracy_pitfall;
    expect(relative(maseScale(training, 1), pitfall.lag1_scale)).toBeLessThan(1e-12);
    expect(relative(mase(holdout.test, holdout.arima.mean, training, 1), pitfall.MASE_lag1_scaling)).toBeLessThan(1e-12);
    expect(mase(holdout.test, holdout.arima.mean, training, period)).not.toBeCloseTo(pitfall.MASE_lag1_scaling, 2);
  });

  it('computes sMAPE by hand', () => {
    // 200·|100 − 110|/(100 + 110) = 2000/210 = 9.5238…; 200·|50 − 40|/(50 + 40) = 2000/90 = 22.222…; mean = 15.873…
    expect(smape([100, 50], [110, 40])).toBeCloseTo((2000 / 210 + 2000 / 90) / 2, 12);
    // Absolute values in the denominator keep it within [0, 200] for negative loads (net export): 200·2/(1 + 1) = 200.
    expect(smape([-1], [1])).toBe(200);
  });

  it('returns documented nulls instead of dividing by zero', () => {
    expect(mape([0, 1], [1, 1])).toBeNull();
    expect(smape([0, 1], [0, 2])).toBeNull();
    expect(mase([1, 2], [1, 1], [5, 6, 5, 6], 2)).toBeNull(); // training repeats exactly every 2 steps: scale 0
  });

  it('refuses empty, misaligned and non-finite input', () => {
    expect(() => mae([], [])).toThrowError(ForecastingError);
    expect(() => rmse([1, 2], [1])).toThrowError(expect.objectContaining({ code: 'invalid-argument' }));
    expect(() => mae([1, Number.NaN], [1, 2])).toThrowError(expect.objectContaining({ code: 'non-finite-input' }));
    expect(() => mase([1], [1], [1, 2], 2)).toThrowError(expect.objectContaining({ code: 'too-few-observations' }));
    expect(() => maseScale([1, 2, 3], 0)).toThrowError(expect.objectContaining({ code: 'invalid-argument' }));
  });
});

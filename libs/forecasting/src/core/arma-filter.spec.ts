import { describe, expect, it } from 'vitest';
import lhData from '../../../../fixtures/reference/data/lh.json';
import lh from '../../../../fixtures/reference/ref/lh.json';
import { armaResiduals } from './arma-filter';
import { ForecastingError } from './errors';

describe('armaResiduals', () => {
  it('reproduces R residuals(arima(lh, order = c(1, 0, 1), method = "CSS")) stored in fixtures/reference/ref/lh.json box_test.arma11_css.residuals', () => {
    // Coefficients from arma["1,1"].css.default (the same call as forecasts.arma11_css.fit).
    // Residuals are stored to 15 significant digits and the coefficients too; 1e-12 absolute on values of order 0.5.
    const { ar1, ma1, intercept } = lh.arma['1,1'].css.default.coef;
    const e = armaResiduals(lhData.values, intercept, [ar1], [ma1]);
    const expected = lh.box_test.arma11_css.residuals;
    expect(e.length).toBe(expected.length);
    for (let t = 0; t < e.length; t++) expect(Math.abs(e[t] - expected[t])).toBeLessThan(1e-12);
  });

  it('reproduces the CSS sum of squares of R arima(lh, order = c(2, 0, 1), method = "CSS") (arma["2,1"].css.css_manual_check.ssq)', () => {
    const fit = lh.arma['2,1'].css.default;
    const coef = fit.coef as Record<string, number>;
    const e = armaResiduals(lhData.values, coef['intercept'], [coef['ar1'], coef['ar2']], [coef['ma1']]);
    expect(e[0]).toBe(0);
    expect(e[1]).toBe(0);
    const ssq = e.reduce((s, v) => s + v * v, 0);
    expect(Math.abs(ssq - lh.arma['2,1'].css.css_manual_check.ssq) / ssq).toBeLessThan(1e-12);
  });

  it('is the AR recursion when q = 0 and white noise when p = q = 0 (closed forms)', () => {
    const x = [1, 3, 2, 5, 4];
    expect(Array.from(armaResiduals(x, 1, [], []))).toEqual([0, 2, 1, 4, 3]);
    const e = armaResiduals(x, 0, [0.5], []);
    expect(Array.from(e)).toEqual([0, 2.5, 0.5, 4, 1.5]);
    // Pure MA(1): e_t = x_t − θ e_{t−1} from e_0 = 0.
    expect(Array.from(armaResiduals([1, 1, 1], 0, [], [0.5]))).toEqual([1, 0.5, 0.75]);
  });

  it('refuses non-finite input', () => {
    expect(() => armaResiduals([1, Number.NaN, 2], 0, [0.5], [])).toThrow(ForecastingError);
  });
});

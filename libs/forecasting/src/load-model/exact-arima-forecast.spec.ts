import { describe, expect, it } from 'vitest';
import { expectRelative, loadReference, loadSeries, maxRelativeError } from '../core/spec-support';
import { multiplyMaPolynomials } from '../seasonal/lag-polynomial';
import { exactArimaForecast } from './exact-arima-forecast';

// Source: fixtures/reference/ref/USAccDeaths.json (copied unchanged from the shared R reference set).
// `seasonal.full_fit`: arima(x, order = c(1, 0, 1), seasonal = list(order = c(0, 1, 1)), method = "ML"),
// `seasonal.full_forecast`: predict(fit_sarima, n.ahead = 24). R 4.2.2. We feed R's coefficients, expand
// the seasonal MA (1 + θB)(1 + ΘB¹²), difference at lag 12 and forecast; no mean (R drops it under D = 1).
const reference = loadReference('USAccDeaths').seasonal;
const x = loadSeries('USAccDeaths');
const { ar1, ma1, sma1 } = reference.full_fit.coef;
const model = { mean: 0, ar: [ar1], ma: multiplyMaPolynomials([ma1], [sma1], 12), sigma2: reference.full_fit.sigma2 };

describe('exactArimaForecast against R predict (USAccDeaths SARIMA(1,0,1)(0,1,1)[12])', () => {
  it('matches the 24 forecasts and standard errors to 1e-6 relative', () => {
    const f = exactArimaForecast(model, x, 12, 24);
    // Asked: 1e-4 (issue 3); we hold 1e-6 since the gap measured 3.7e-7 (mean), 3.5e-9 (se): R's finite diffuse prior
    // κ = 1e6 on the differencing states against our exact conditioning on the first 12 values.
    expectRelative(f.mean, reference.full_forecast.mean, 1e-6, 'mean');
    expectRelative(f.se, reference.full_forecast.se, 1e-6, 'se');
    console.info(`USAccDeaths exact: max rel mean ${maxRelativeError(f.mean, reference.full_forecast.mean).toExponential(2)}, se ${maxRelativeError(f.se, reference.full_forecast.se).toExponential(2)}`);
  });

  it('reduces to the AR recursion for a pure AR model (state known exactly after p values)', () => {
    const ar = { mean: 10, ar: [0.5, 0.3], ma: [], sigma2: 2 };
    const series = [9, 11, 12, 10, 8, 9.5, 10.5];
    const f = exactArimaForecast(ar, series, null, 3);
    const h1 = 10 + 0.5 * (10.5 - 10) + 0.3 * (9.5 - 10);
    const h2 = 10 + 0.5 * (h1 - 10) + 0.3 * (10.5 - 10);
    expect(f.mean[0]).toBeCloseTo(h1, 12);
    expect(f.mean[1]).toBeCloseTo(h2, 12);
    // ψ_1 = φ_1, ψ_2 = φ_1² + φ_2 (Brockwell & Davis 2016 §3.1): se² = σ²(1 + ψ_1² + ψ_2²).
    expect(f.se[0]).toBeCloseTo(Math.sqrt(2), 12);
    expect(f.se[2]).toBeCloseTo(Math.sqrt(2 * (1 + 0.25 + (0.25 + 0.3) ** 2)), 12);
  });

  it('refuses a non-stationary AR part', () => {
    expect(() => exactArimaForecast({ mean: 0, ar: [1.01], ma: [], sigma2: 1 }, [1, 2, 3], null, 2)).toThrow(/unit circle/);
  });
});

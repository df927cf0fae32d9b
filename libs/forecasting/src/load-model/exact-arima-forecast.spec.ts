import { describe, expect, it } from 'vitest';
import { expectRelative, loadReference, loadSeries, maxRelativeError } from '../core/spec-support';
import { forecastArma } from '../forecast/forecast-arma';
import { psiWeights } from '../forecast/psi-weights';
import { integrateSeasonalDifference, seasonalDifference } from '../seasonal/seasonal-difference';
import { arWithSeasonalDifference, multiplyMaPolynomials } from '../seasonal/lag-polynomial';
import { exactArimaForecast } from './exact-arima-forecast';
import { seededNormal } from './synthetic-load.testing';

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
    console.info(
      `USAccDeaths exact: max rel mean ${maxRelativeError(f.mean, reference.full_forecast.mean).toExponential(2)}, se ${maxRelativeError(f.se, reference.full_forecast.se).toExponential(2)}`,
    );
  });

  it('shows why: the conditional recursion the hourly pipeline uses is off by up to 2 % on this short series', () => {
    // forecastArma with zero pre-sample errors on the 60 differences, integrated, with ψ-weight se of
    // φ(B)(1 − B¹²): the start-up error decays like |Θ|^(n/12) = 0.6^5 ≈ 0.08 here (measured: 1.6 % in
    // the mean, 0.15 % in se), but like 0.6^(8760/168) ≈ 3e-12 on a year of hourly data at lag 168.
    const w = seasonalDifference(x, 12);
    const part = forecastArma(model, w, 24);
    const mean = integrateSeasonalDifference(x, part.mean, 12);
    const psi = psiWeights(arWithSeasonalDifference([ar1], 12), model.ma, 24);
    let sum = 0;
    const se = Float64Array.from(psi, (v) => Math.sqrt(model.sigma2 * (sum += v * v)));
    expect(maxRelativeError(mean, reference.full_forecast.mean)).toBeLessThan(0.02);
    expect(maxRelativeError(mean, reference.full_forecast.mean)).toBeGreaterThan(1e-3);
    expect(maxRelativeError(se, reference.full_forecast.se)).toBeLessThan(0.002);
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

describe('exactArimaForecast and the ψ-weight reassembly the pipeline uses', () => {
  it('agree once the end-of-sample state is known (long series), validating ψ-weights of φ(B)(1 − B^s)', () => {
    // Simulate 2400 months of the USAccDeaths SARIMA with R's coefficients (seeded): the state-uncertainty
    // term decays like |Θ|^(n/12) = 0.6^200 ≈ 1e-44, so the exact se must equal σ·√Σψ*² to rounding.
    const normal = seededNormal(3);
    const n = 2400;
    const e = Float64Array.from({ length: n }, () => normal() * Math.sqrt(model.sigma2));
    const w = new Float64Array(n);
    for (let t = 0; t < n; t++) {
      let v = e[t] + (t >= 1 ? ar1 * w[t - 1] : 0);
      model.ma.forEach((theta, j) => {
        if (t - j - 1 >= 0) v += theta * e[t - j - 1];
      });
      w[t] = v;
    }
    const series = new Float64Array(n + 12);
    series.set(x.slice(0, 12));
    for (let t = 12; t < series.length; t++) series[t] = series[t - 12] + w[t - 12];
    const exact = exactArimaForecast(model, series, 12, 36);
    const psi = psiWeights(arWithSeasonalDifference([ar1], 12), model.ma, 36);
    let sum = 0;
    const psiSe = Float64Array.from(psi, (v) => {
      sum += v * v;
      return Math.sqrt(model.sigma2 * sum);
    });
    expectRelative(exact.se, psiSe, 1e-9, 'se');
  });
});

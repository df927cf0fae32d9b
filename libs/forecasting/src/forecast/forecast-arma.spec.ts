import { describe, expect, it } from 'vitest';
import { armaResiduals } from '../core/arma-filter';
import { expectRelative, loadReference, loadSeries, referenceSeries } from '../core/spec-support';
import type { ArmaParameters } from '../core/types';
import { armaMeanForecaster, forecastArma, forecastArmaMean, forecastArmaSe } from './forecast-arma';
import { predictionIntervals } from './intervals';

/** The stored coefficients and sigma2 of an R arima fit as our parameters. */
function parametersOf(fit: { coef: Record<string, number>; sigma2: number }, p: number, q: number): ArmaParameters {
  return {
    mean: fit.coef['intercept'],
    ar: Array.from({ length: p }, (_, i) => fit.coef[`ar${i + 1}`]),
    ma: Array.from({ length: q }, (_, j) => fit.coef[`ma${j + 1}`]),
    sigma2: fit.sigma2,
  };
}

describe('forecastArma and predictionIntervals against R predict()', () => {
  // Source: fixtures/reference/ref/<series>.json, forecasts.ar2_ml = 'predict(fit_ar2_ml, n.ahead = 24)' with
  // 'fit_ar2_ml = arima(x, order = c(2, 0, 0), method = "ML")' (coefficients and sigma2 from ml_ar["2"].default), and
  // forecasts.arma11_css = 'predict(fit_arma11_css, n.ahead = 24)' with the CSS ARMA(1,1) fit (arma["1,1"].css.default).
  // We forecast from R's stored coefficients, so only their 15-digit rounding separates the answers; the agreed
  // tolerance is 1e-4 and we hold 1e-9 relative.
  for (const name of referenceSeries) {
    it(`matches R for the exact-ML AR(2) on ${name}, 24 steps, with 80 % and 95 % intervals`, () => {
      const reference = loadReference(name);
      const f = forecastArma(parametersOf(reference.ml_ar['2'].default, 2, 0), loadSeries(name), 24);
      const r = reference.forecasts.ar2_ml;
      expectRelative(f.mean, r.mean, 1e-9, `${name} AR(2) mean`);
      expectRelative(f.se, r.se, 1e-9, `${name} AR(2) se`);
      const [i80, i95] = predictionIntervals(f, [80, 95]);
      expectRelative(i80.lower, r.lower80, 1e-9, `${name} lower80`);
      expectRelative(i80.upper, r.upper80, 1e-9, `${name} upper80`);
      expectRelative(i95.lower, r.lower95, 1e-9, `${name} lower95`);
      expectRelative(i95.upper, r.upper95, 1e-9, `${name} upper95`);
    });

    it(`matches R for the CSS ARMA(1,1) on ${name}, using its CSS residuals for the MA term`, () => {
      const reference = loadReference(name);
      const fit = reference.arma['1,1'].css.default;
      expect(reference.forecasts.arma11_css.fit).toContain('method = "CSS"');
      const f = forecastArma(parametersOf(fit, 1, 1), loadSeries(name), 24);
      const r = reference.forecasts.arma11_css;
      expectRelative(f.mean, r.mean, 1e-9, `${name} ARMA(1,1) mean`);
      expectRelative(f.se, r.se, 1e-9, `${name} ARMA(1,1) se`);
      const [i95] = predictionIntervals(f, [95]);
      expectRelative(i95.lower, r.lower95, 1e-9, `${name} ARMA(1,1) lower95`);
    });
  }

  it('uses supplied residuals instead of recomputing them', () => {
    const x = loadSeries('lh');
    const model = { mean: 2.4, ar: [0.5], ma: [0.3], sigma2: 0.2 };
    const e = armaResiduals(x, model.mean, model.ar, model.ma);
    expect(Array.from(forecastArma(model, x, 3, e).mean)).toEqual(Array.from(forecastArma(model, x, 3).mean));
    const shifted = e.map((v, t) => (t === e.length - 1 ? v + 1 : v));
    // One more unit of e_n moves f_1 by θ_1 = 0.3 (h = 1 is the only step that sees e_n).
    expect(forecastArma(model, x, 1, shifted).mean[0] - forecastArma(model, x, 1, e).mean[0]).toBeCloseTo(0.3, 14);
  });
});

describe('forecastArma closed forms', () => {
  it('AR(1): f_h = μ + φ^h (x_n − μ) and se_h² = σ²(1 − φ^{2h})/(1 − φ²) (Brockwell & Davis 2016, §3.3)', () => {
    const model = { mean: 10, ar: [0.6], ma: [], sigma2: 4 };
    const f = forecastArma(model, [9, 11, 13], 5);
    for (let h = 1; h <= 5; h++) {
      expect(f.mean[h - 1]).toBeCloseTo(10 + 0.6 ** h * 3, 13);
      expect(f.se[h - 1]).toBeCloseTo(Math.sqrt((4 * (1 - 0.6 ** (2 * h))) / (1 - 0.36)), 13);
    }
  });

  it('white noise forecasts the mean with constant se = σ', () => {
    const f = forecastArma({ mean: 3, ar: [], ma: [], sigma2: 2.25 }, [1, 5], 3);
    expect(Array.from(f.mean)).toEqual([3, 3, 3]);
    expect(Array.from(f.se)).toEqual([1.5, 1.5, 1.5]);
  });

  it('refuses bad horizons, σ² and residual lengths', () => {
    const model = { mean: 0, ar: [0.5], ma: [], sigma2: 1 };
    expect(() => forecastArma(model, [1, 2], 0)).toThrow(expect.objectContaining({ code: 'invalid-argument' }));
    expect(() => forecastArma({ ...model, sigma2: 0 }, [1, 2], 2)).toThrow(expect.objectContaining({ code: 'invalid-argument' }));
    expect(() => forecastArma(model, [1, 2], 2, [0])).toThrow(expect.objectContaining({ code: 'invalid-argument' }));
    expect(() => forecastArma({ ...model, ar: [0.5, 0.2, 0.1] }, [1, 2], 2)).toThrow(
      expect.objectContaining({ code: 'too-few-observations' }),
    );
    // An explosive AR(1) (φ = 10) overflows within 400 steps: refused rather than returning Infinity.
    expect(() => forecastArma({ ...model, ar: [10] }, [1, 2], 400)).toThrow(expect.objectContaining({ code: 'non-finite-input' }));
  });
});

describe('forecastArmaMean and forecastArmaSe', () => {
  it('are the two halves of forecastArma, bit for bit, and the standard errors do not depend on the history', () => {
    const x = loadSeries('lh');
    const model = { mean: 2.4, ar: [0.5, 0, -0.2], ma: [0.3, 0.1], sigma2: 0.2 };
    const full = forecastArma(model, x, 30);
    expect(Array.from(forecastArmaMean(model, x, 30))).toEqual(Array.from(full.mean));
    expect(Array.from(forecastArmaSe(model, 30))).toEqual(Array.from(full.se));
    // From a shorter history and horizon: the same first standard errors, only the means move.
    const earlier = forecastArma(model, x.slice(0, 20), 12);
    expect(Array.from(forecastArmaSe(model, 30).subarray(0, 12))).toEqual(Array.from(earlier.se));
    expect(Array.from(forecastArmaMean(model, x.slice(0, 20), 12))).toEqual(Array.from(earlier.mean));
  });

  it('armaMeanForecaster reuses its working buffer across origins without carrying anything from one to the next', () => {
    const x = loadSeries('lh');
    const model = { mean: 2.4, ar: [0.5, 0, -0.2], ma: [0.3, 0.1], sigma2: 0.2 };
    const forecastFrom = armaMeanForecaster(model);
    // Longer and shorter horizons from later and earlier origins, in mixed order.
    for (const [end, horizon] of [
      [20, 5],
      [48, 30],
      [10, 2],
      [40, 30],
      [25, 12],
    ]) {
      const history = x.slice(0, end);
      expect(Array.from(forecastFrom(history, horizon)), `origin ${end}`).toEqual(Array.from(forecastArma(model, history, horizon).mean));
    }
  });

  it('refuse what forecastArma refuses', () => {
    const model = { mean: 0, ar: [0.5], ma: [], sigma2: 1 };
    expect(() => forecastArmaMean(model, [1, 2], 0)).toThrow(expect.objectContaining({ code: 'invalid-argument' }));
    expect(() => forecastArmaMean(model, [1, 2], 2, [0])).toThrow(expect.objectContaining({ code: 'invalid-argument' }));
    expect(() => forecastArmaSe({ ...model, sigma2: 0 }, 2)).toThrow(expect.objectContaining({ code: 'invalid-argument' }));
    expect(() => forecastArmaMean({ ...model, ar: [10] }, [1, 2], 400)).toThrow(expect.objectContaining({ code: 'non-finite-input' }));
    expect(() => forecastArmaSe({ ...model, ar: [10] }, 400)).toThrow(expect.objectContaining({ code: 'non-finite-input' }));
  });
});

/**
 * Point forecasts and their standard errors h = 1..H steps ahead from a fitted ARMA(p, q).
 *
 * Model: (x_t − μ) = Σ φ_i (x_{t−i} − μ) + e_t + Σ θ_j e_{t−j}. With w = x − μ,
 * ŵ_{n+h} = Σ_i φ_i ŵ_{n+h−i} + Σ_{j=h..q} θ_j e_{n+h−j}, where ŵ_s = w_s for s ≤ n and future
 * errors are 0; se_h = σ·sqrt(Σ_{j<h} ψ_j²).
 *
 * Method: minimum mean-square-error forecasts by the difference-equation form (Box, Jenkins, Reinsel
 * & Ljung 2016, Time Series Analysis, 5th ed., §5.1–5.2; Brockwell & Davis 2016, Introduction to
 * Time Series and Forecasting, 3rd ed., §3.3, eq. 3.3.11 and §5.4 for the ψ-weight variance).
 *
 * Conventions: conditional on the history and on the supplied one-step residuals; when none are
 * given they are the CSS residuals (core/arma-filter.ts: first p set to 0, pre-sample errors 0), so a
 * CSS fit forecasts as R's `predict` does (which equals the CSS recursion to 1e-15 on the reference
 * series, fixtures/reference/README.md, convention 9). The standard errors ignore parameter
 * uncertainty, as is usual (common practice, and R's `predict.Arima`).
 *
 * @throws ForecastingError('invalid-argument') unless horizon is a positive integer, σ² > 0 and the
 *   residuals match the history in length; ('too-few-observations') when the history is shorter
 *   than max(p, 1); ('non-finite-input') for non-finite inputs, or forecasts that overflow because the
 *   model is explosive.
 *
 * References: Box et al. (2016) §5; Brockwell & Davis (2016) §3.3 and §5.4; R `stats::predict.Arima`.
 */
import { armaResiduals, nonZeroTerms } from '../core/arma-filter';
import { assertFinite, assertLength, ForecastingError } from '../core/errors';
import type { ArmaParameters } from '../core/types';
import { psiWeights } from './psi-weights';

/** Conditional means and forecast standard errors for h = 1..H (index h − 1). */
export interface PointForecast {
  /** Conditional mean μ + ŵ_{n+h}. */
  mean: Float64Array;
  /** Forecast standard error σ·sqrt(Σ_{j<h} ψ_j²). */
  se: Float64Array;
}

/** Forecasts `horizon` steps past the end of `history` from the model. */
export function forecastArma(
  model: ArmaParameters,
  history: ArrayLike<number>,
  horizon: number,
  residuals?: ArrayLike<number>,
): PointForecast {
  const fn = 'forecastArma';
  checkHorizon(fn, horizon);
  checkVariance(fn, model.sigma2);
  const mean = conditionalMeans(
    fn,
    model,
    history,
    horizon,
    residuals,
    nonZeroTerms(model.ar),
    new Float64Array(model.ar.length + horizon),
  );
  const se = psiStandardErrors(model, horizon);
  assertFinite(fn, mean, 'forecasts (the model is far from stationary)');
  assertFinite(fn, se, 'forecast standard errors (the model is far from stationary)');
  return { mean, se };
}

/**
 * The conditional means of forecastArma alone: for forecasting from many origins with one model, whose
 * standard errors (forecastArmaSe) do not depend on the origin and are computed once.
 */
export function forecastArmaMean(
  model: ArmaParameters,
  history: ArrayLike<number>,
  horizon: number,
  residuals?: ArrayLike<number>,
): Float64Array {
  return armaMeanForecaster(model)(history, horizon, residuals);
}

/**
 * forecastArmaMean for many histories of one model (the rolling origins of a backtest or a band calibration):
 * the non-zero φ are found once and one working buffer serves every call, so each call allocates only the
 * means it returns.
 */
export function armaMeanForecaster(
  model: ArmaParameters,
): (history: ArrayLike<number>, horizon: number, residuals?: ArrayLike<number>) => Float64Array {
  const fn = 'forecastArmaMean';
  const terms = nonZeroTerms(model.ar);
  let work = new Float64Array(0);
  return (history, horizon, residuals) => {
    checkHorizon(fn, horizon);
    const size = model.ar.length + horizon;
    if (work.length < size) work = new Float64Array(size);
    const mean = conditionalMeans(fn, model, history, horizon, residuals, terms, work);
    assertFinite(fn, mean, 'forecasts (the model is far from stationary)');
    return mean;
  };
}

/** The standard errors of forecastArma, σ·sqrt(Σ_{j<h} ψ_j²) for h = 1..horizon: the same from every origin. */
export function forecastArmaSe(model: ArmaParameters, horizon: number): Float64Array {
  const fn = 'forecastArmaSe';
  checkHorizon(fn, horizon);
  checkVariance(fn, model.sigma2);
  const se = psiStandardErrors(model, horizon);
  assertFinite(fn, se, 'forecast standard errors (the model is far from stationary)');
  return se;
}

function checkHorizon(fn: string, horizon: number): void {
  if (!Number.isInteger(horizon) || horizon < 1)
    throw new ForecastingError('invalid-argument', fn, `needs a positive integer horizon, got ${horizon}`);
}

function checkVariance(fn: string, sigma2: number): void {
  if (!(sigma2 > 0) || !Number.isFinite(sigma2))
    throw new ForecastingError('invalid-argument', fn, `needs a positive finite σ², got ${sigma2}`);
}

/**
 * μ + ŵ_{n+h} for h = 1..horizon by the difference equation (inputs checked, the result not), with the model's
 * non-zero φ (`terms`) and a working buffer `w` of at least p + horizon values.
 */
function conditionalMeans(
  fn: string,
  model: ArmaParameters,
  history: ArrayLike<number>,
  horizon: number,
  residuals: ArrayLike<number> | undefined,
  terms: { lags: Int32Array; coefficients: Float64Array },
  w: Float64Array,
): Float64Array {
  const { mean: mu, ar, ma } = model;
  if (!Number.isFinite(mu)) throw new ForecastingError('non-finite-input', fn, `mean is ${mu}`);
  assertFinite(fn, history, 'history');
  assertLength(fn, history, Math.max(ar.length, 1), `the last p = ${ar.length} values start the recursion`);
  const p = ar.length;
  const q = ma.length;
  const n = history.length;
  const e = residuals ?? armaResiduals(history, mu, ar, ma);
  if (e.length !== n) throw new ForecastingError('invalid-argument', fn, `residuals have length ${e.length}, the history ${n}`);
  assertFinite(fn, e, 'residuals');

  // w holds the last p deviations followed by the forecasts (each written before it is read).
  for (let i = 0; i < p; i++) w[i] = history[n - p + i] - mu;
  const mean = new Float64Array(horizon);
  // Non-zero φ only (same order, so the same sums): wide-lag AR fits are mostly zeros.
  for (let h = 1; h <= horizon; h++) {
    let value = 0;
    for (let k = 0; k < terms.lags.length; k++) value += terms.coefficients[k] * w[p + h - 1 - terms.lags[k]];
    // Known errors e_{n+h−j} for j ≥ h; future errors are 0.
    for (let j = h; j <= q; j++) {
      const s = n + h - j - 1;
      if (s >= 0) value += ma[j - 1] * e[s];
    }
    w[p + h - 1] = value;
    mean[h - 1] = mu + value;
  }
  return mean;
}

/** σ·sqrt(Σ_{j<h} ψ_j²) for h = 1..horizon (the result not checked). */
function psiStandardErrors(model: ArmaParameters, horizon: number): Float64Array {
  const psi = psiWeights(model.ar, model.ma, horizon);
  const se = new Float64Array(horizon);
  let cumulative = 0;
  for (let h = 0; h < horizon; h++) {
    cumulative += psi[h] * psi[h];
    se[h] = Math.sqrt(model.sigma2 * cumulative);
  }
  return se;
}

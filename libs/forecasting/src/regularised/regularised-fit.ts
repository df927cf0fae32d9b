/**
 * The result shape shared by ridge and lasso AR and the step that turns standardised coefficients into it.
 *
 * Model: (x_t − μ) = Σ_{j} φ_{L_j} (x_{t−L_j} − μ) + e_t over a lag set L (R's arima sign convention);
 *   `ar` has length max(L) with zeros at lags outside L or benched.
 * Method: back-transform β̃_j (standardised) to φ_{L_j} = β̃_j / s_j and c = ȳ − Σ φ_{L_j} x̄_j; μ = c / (1 − Σφ).
 * Conventions: conditional on the first maxLag values; σ² = RSS/(n − maxLag) (conditional MLE, as R's
 *   arima CSS and ar.ols); conditional Gaussian log-likelihood ℓ = −((n − maxLag)/2)(log(2πσ²) + 1);
 *   the number of parameters counted by AIC/AICc/BIC is k = df + 2 (df of the penalised coefficients,
 *   plus the mean and σ²), with BIC's log(n − maxLag). df is reported beside them.
 * @throws ForecastingError 'non-stationary' when the AR polynomial has a root on or inside the unit circle
 *   (step-down test, core/ar-stationarity.ts; μ is then undefined and forecasts would diverge); 'constant-series' when the lags reproduce the series
 *   exactly (σ² = 0).
 * References: Zou, Hastie & Tibshirani (2007), Ann. Statist. 35(5) (lasso df); Hastie, Tibshirani & Friedman
 *   (2009) §3.4.1 eq. 3.50 (ridge df); Brockwell & Davis (2016) §5.2 (conditional likelihood).
 */
import { ForecastingError } from '../core/errors';
import type { FitResult } from '../core/types';
import { isCausalAr } from '../core/ar-stationarity';
import type { LaggedDesign } from './lagged-design';

/** How the penalty was chosen. */
export type PenaltySelection = 'bic' | 'validation';

/** Options shared by ridgeAr and lassoAr. */
export interface RegularisedArOptions {
  /** Lags in the model, e.g. 1..48 and 168 for hourly load. */
  lags: number[];
  /** A fixed penalty λ ≥ 0 (ridge and lasso scale it differently: see each file). Excludes `select`. */
  lambda?: number;
  /** How to choose λ when `lambda` is absent (default 'bic'). */
  select?: PenaltySelection;
  /** Rolling-origin validation: number of consecutive validation blocks (default 5). */
  folds?: number;
  /** Rolling-origin validation: share of the usable rows held out across all blocks (default 0.2). */
  validationFraction?: number;
}

/** One penalty on the searched path and what it scored. */
export interface PenaltyPathPoint {
  lambda: number;
  /** Degrees of freedom of the penalised coefficients at this λ. */
  df: number;
  /** BIC (k = df + 2) at this λ on the full series, or null when the fit is non-stationary (or its RSS is 0). */
  bic: number | null;
  /** Mean squared one-step validation error, when selecting by validation. */
  validationMse: number | null;
  /** Whether the fit on the full series is stationary; null when not checked (a better-scoring fit was stationary). */
  stationary: boolean | null;
}

/** A ridge or lasso AR fit (engine.md's agreed shape plus what the penalty search saw). */
export interface RegularisedFit extends FitResult {
  /** The lag set, increasing. */
  lags: number[];
  /** Lags with a non-zero coefficient. */
  kept: number[];
  /** Lags whose coefficient is exactly zero. */
  benched: number[];
  /** The penalty used. */
  lambda: number;
  /** Degrees of freedom used in the criteria (lasso: non-zero count; ridge: trace of the hat matrix). */
  df: number;
  /** Regression intercept c = μ(1 − Σφ). */
  intercept: number;
  /** 'fixed' when λ was given, otherwise how it was chosen. */
  selection: 'fixed' | PenaltySelection;
  /** The searched penalties (empty when λ was fixed). */
  path: PenaltyPathPoint[];
}

/** Standardised coefficients and their degrees of freedom at one λ. */
export interface StandardisedSolution {
  lambda: number;
  beta: Float64Array;
  df: number;
  /** Residual sum of squares at beta, when the solver has it already (else it is computed from the rows). */
  rss?: number;
}

/** AR coefficients (length maxLag, zeros outside the lag set) and intercept from standardised coefficients. */
export function backTransform(design: LaggedDesign, beta: ArrayLike<number>): { ar: number[]; intercept: number } {
  const ar = new Array<number>(design.maxLag).fill(0);
  let intercept = design.responseMean;
  for (let j = 0; j < design.lags.length; j++) {
    const phi = beta[j] / design.columnScales[j];
    ar[design.lags[j] - 1] = phi;
    intercept -= phi * design.columnMeans[j];
  }
  return { ar, intercept };
}

/** Residual sum of squares of the standardised problem at coefficients `beta`. */
export function residualSumOfSquares(design: LaggedDesign, beta: ArrayLike<number>): number {
  const residual = Float64Array.from(design.response);
  for (let j = 0; j < design.columns.length; j++) {
    const b = beta[j];
    if (b === 0) continue;
    const column = design.columns[j];
    for (let r = 0; r < design.rows; r++) residual[r] -= b * column[r];
  }
  let rss = 0;
  for (let r = 0; r < design.rows; r++) rss += residual[r] * residual[r];
  return rss;
}

/** Conditional Gaussian information criteria for RSS over m rows with k = df + 2 parameters. */
export function criteria(rss: number, rows: number, df: number): { loglik: number; aic: number; aicc: number | null; bic: number } {
  const sigma2 = rss / rows;
  const loglik = -0.5 * rows * (Math.log(2 * Math.PI * sigma2) + 1);
  const k = df + 2;
  const aic = -2 * loglik + 2 * k;
  const aicc = rows - k - 1 > 0 ? aic + (2 * k * (k + 1)) / (rows - k - 1) : null;
  return { loglik, aic, aicc, bic: -2 * loglik + Math.log(rows) * k };
}

/** Turns the chosen standardised solution into a RegularisedFit for the series `x`. */
export function assembleFit(
  fn: string,
  method: 'ridge' | 'lasso',
  x: ArrayLike<number>,
  design: LaggedDesign,
  solution: StandardisedSolution,
  extra: { selection: 'fixed' | PenaltySelection; path: PenaltyPathPoint[]; converged: boolean | null; iterations: number | null },
): RegularisedFit {
  const { ar, intercept } = backTransform(design, solution.beta);
  if (!isCausalAr(ar)) {
    throw new ForecastingError(
      'non-stationary',
      fn,
      `the fitted AR polynomial at λ = ${solution.lambda} has a root on or inside the unit circle; difference the series (lag 24 or 168) or remove its profile first`,
    );
  }
  const sumPhi = ar.reduce((s, v) => s + v, 0);
  const mean = intercept / (1 - sumPhi);

  const residuals = new Float64Array(x.length);
  let rss = 0;
  // Only the kept lags: a benched lag adds an exact zero.
  const terms = design.lags.filter((lag) => ar[lag - 1] !== 0);
  for (let t = design.maxLag; t < x.length; t++) {
    let fitted = intercept;
    for (const lag of terms) fitted += ar[lag - 1] * x[t - lag];
    const e = x[t] - fitted;
    residuals[t] = e;
    rss += e * e;
  }
  if (!(rss > 0)) throw new ForecastingError('constant-series', fn, 'the lags reproduce the series exactly, so σ² = 0');
  const sigma2 = rss / design.rows;
  const info = criteria(rss, design.rows, solution.df);
  const kept = design.lags.filter((_, j) => solution.beta[j] !== 0);
  const benched = design.lags.filter((_, j) => solution.beta[j] === 0);
  return {
    method,
    mean,
    ar,
    ma: [],
    sigma2,
    p: design.maxLag,
    q: 0,
    n: x.length,
    stderr: { ar: null, ma: null, mean: null },
    loglik: info.loglik,
    aic: info.aic,
    aicc: info.aicc,
    bic: info.bic,
    converged: extra.converged,
    iterations: extra.iterations,
    residuals,
    lags: design.lags,
    kept,
    benched,
    lambda: solution.lambda,
    df: solution.df,
    intercept,
    selection: extra.selection,
    path: extra.path,
  };
}

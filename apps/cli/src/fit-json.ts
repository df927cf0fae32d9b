/**
 * The JSON shape of a fitted model on standard output: the agreed fields, null where the method has
 * no value, plus the lag bookkeeping of ridge and lasso fits.
 */
import type { FitResult, RegularisedFit } from '@loadwright/forecasting';

/** A fit as the command prints it. */
export interface FitJson {
  /** The estimator's name. */
  method: string;
  /** AR order. */
  p: number;
  /** MA order. */
  q: number;
  /** Observations used. */
  n: number;
  /** Process mean μ. */
  mean: number;
  /** φ_1..φ_p (R arima sign convention). */
  ar: number[];
  /** θ_1..θ_q (R arima sign convention). */
  ma: number[];
  /** Innovation variance σ². */
  sigma2: number;
  /** Standard errors, null where the method has none. */
  stderr: { ar: number[] | null; ma: number[] | null; mean: number | null };
  /** Log-likelihood as the estimator defines it, or null. */
  loglik: number | null;
  /** Akaike information criterion, or null. */
  aic: number | null;
  /** Schwarz (Bayesian) information criterion, or null. */
  bic: number | null;
  /** Iterative estimators: whether they converged; otherwise null. */
  converged: boolean | null;
  /** Iterative estimators: iterations taken; otherwise null. */
  iterations: number | null;
  /** Ridge and lasso: the lag set. */
  lags?: number[];
  /** Ridge and lasso: lags with a non-zero coefficient. */
  kept?: number[];
  /** Ridge and lasso: lags set to zero. */
  benched?: number[];
  /** Ridge and lasso: the penalty used. */
  lambda?: number;
}

/** Picks the printed fields from a fit (residuals stay out: they are as long as the series). */
export function fitJson(fit: FitResult): FitJson {
  const json: FitJson = {
    method: fit.method,
    p: fit.p,
    q: fit.q,
    n: fit.n,
    mean: fit.mean,
    ar: [...fit.ar],
    ma: [...fit.ma],
    sigma2: fit.sigma2,
    stderr: { ar: fit.stderr.ar, ma: fit.stderr.ma, mean: fit.stderr.mean },
    loglik: fit.loglik,
    aic: fit.aic,
    bic: fit.bic,
    converged: fit.converged,
    iterations: fit.iterations,
  };
  if (fit.method === 'ridge' || fit.method === 'lasso') {
    const regularised = fit as RegularisedFit;
    Object.assign(json, { lags: regularised.lags, kept: regularised.kept, benched: regularised.benched, lambda: regularised.lambda });
  }
  return json;
}

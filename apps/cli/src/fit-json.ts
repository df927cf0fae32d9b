/**
 * The JSON shape of a fitted model on standard output: the agreed fields, null where the method has
 * no value, plus the lag bookkeeping of ridge and lasso fits.
 */
import type { FitResult, RegularisedFit } from '@loadwright/forecasting';

/** A fit as the command prints it. */
export interface FitJson {
  method: string;
  p: number;
  q: number;
  n: number;
  mean: number;
  ar: number[];
  ma: number[];
  sigma2: number;
  stderr: { ar: number[] | null; ma: number[] | null; mean: number | null };
  loglik: number | null;
  aic: number | null;
  bic: number | null;
  converged: boolean | null;
  iterations: number | null;
  lags?: number[];
  kept?: number[];
  benched?: number[];
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

import { cmleAr } from '../ar/cmle';
import { yuleWalker } from '../ar/yule-walker';
import { nlsArma } from '../arma/nls';
import { ForecastingError } from '../core/errors';
import type { FitMethod, FitResult } from '../core/types';
import { lassoAr } from '../regularised/lasso';
import { ridgeAr } from '../regularised/ridge';
import type { LoadModelSpec } from './load-model-spec';

/**
 * Fits the ARMA part of a load model to the remainder series with the spec's estimator:
 * yule-walker and cmle (AR only), nls (ARMA, CSS), ridge and lasso (regularised AR over `lags`, default
 * 1..p). Each estimator keeps its own conventions (see its file).
 *
 * @throws ForecastingError 'invalid-argument' for q > 0 with an AR-only method or an unknown method;
 *   'no-convergence' when the NLS fit did not converge (so the caller can fall back to an AR method);
 *   whatever the estimator throws.
 */
export function fitArmaPart(
  spec: Pick<LoadModelSpec, 'method' | 'p' | 'q' | 'lags' | 'lambda' | 'select'>,
  remainder: Float64Array,
): FitResult {
  const fn = 'fitArmaPart';
  const method = spec.method as FitMethod;
  if (spec.q > 0 && method !== 'nls') {
    throw new ForecastingError('invalid-argument', fn, `method '${spec.method}' fits AR models only: set q = 0 or use 'nls'`);
  }
  switch (method) {
    case 'yule-walker':
      return yuleWalker(remainder, spec.p);
    case 'cmle':
      return cmleAr(remainder, spec.p);
    case 'nls': {
      const fit = nlsArma(remainder, spec.p, spec.q);
      if (fit.converged === false) {
        throw new ForecastingError(
          'no-convergence',
          fn,
          `NLS ARMA(${spec.p},${spec.q}) did not converge in ${fit.iterations} iterations: fall back to 'cmle'`,
        );
      }
      return fit;
    }
    case 'ridge':
    case 'lasso': {
      const lags = spec.lags ?? Array.from({ length: spec.p }, (_, i) => i + 1);
      const options = { lags, ...(spec.lambda !== undefined ? { lambda: spec.lambda } : { select: spec.select ?? 'bic' }) };
      return method === 'ridge' ? ridgeAr(remainder, options) : lassoAr(remainder, options);
    }
    default:
      throw new ForecastingError('invalid-argument', fn, `unknown method '${spec.method}'`);
  }
}

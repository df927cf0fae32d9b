import { ForecastingError, assertFinite } from '../core/errors';

/**
 * Natural-log transform for load series whose variability grows with the level.
 *
 * @throws ForecastingError 'invalid-argument' at the first value that is not strictly positive.
 */
export function logTransform(values: ArrayLike<number>): Float64Array {
  assertFinite('logTransform', values);
  const out = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) {
    if (!(values[i] > 0)) {
      throw new ForecastingError(
        'invalid-argument',
        'logTransform',
        `log needs positive values, got ${values[i]} at index ${i}: turn the log transform off`,
      );
    }
    out[i] = Math.log(values[i]);
  }
  return out;
}

/** A forecast carried back from the log scale. */
export interface LogBackTransformed {
  /** Bias-adjusted mean exp(m + s²/2) of the lognormal forecast distribution. */
  mean: Float64Array;
  /** Median exp(m). */
  median: Float64Array;
  /** Lognormal standard deviation sqrt((exp(s²) − 1) · exp(2m + s²)). */
  se: Float64Array;
}

/**
 * Back-transforms a Gaussian forecast N(m, s²) of log y. If log y ~ N(m, s²), y is lognormal with
 * median exp(m), mean exp(m + s²/2) and the standard deviation above (Johnson, Kotz & Balakrishnan 1994,
 * Continuous Univariate Distributions vol. 1, ch. 14). Interval bounds are quantiles and map one by one
 * through exp (exp is monotone), see `backTransformLogBound`.
 *
 * @throws ForecastingError 'non-finite-input' if exp overflows (forecast far outside the data).
 */
export function backTransformLog(m: ArrayLike<number>, s: ArrayLike<number>): LogBackTransformed {
  const n = m.length;
  const mean = new Float64Array(n);
  const median = new Float64Array(n);
  const se = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const v = s[i] * s[i];
    median[i] = Math.exp(m[i]);
    mean[i] = Math.exp(m[i] + v / 2);
    se[i] = Math.sqrt(Math.expm1(v) * Math.exp(2 * m[i] + v));
  }
  assertFinite('backTransformLog', mean, 'back-transformed forecast');
  assertFinite('backTransformLog', se, 'back-transformed standard error');
  return { mean, median, se };
}

/** Maps interval bounds (quantiles of log y) to quantiles of y. */
export function backTransformLogBound(bound: ArrayLike<number>): Float64Array {
  const out = Float64Array.from(bound, Math.exp);
  assertFinite('backTransformLogBound', out, 'back-transformed bound');
  return out;
}

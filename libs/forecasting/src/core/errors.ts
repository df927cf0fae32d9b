/** What went wrong, as a stable code callers can switch on (the worker falls back on some). */
export type ForecastingErrorCode =
  | 'too-few-observations'
  | 'constant-series'
  | 'non-finite-input'
  | 'non-stationary'
  | 'not-invertible'
  | 'no-convergence'
  | 'singular-matrix'
  | 'invalid-argument';

/**
 * The one error type libs/forecasting throws. `fn` names the function that refused, and the
 * message says what it needs, e.g. "yuleWalker: needs at least p + 2 = 5 observations, got 3".
 */
export class ForecastingError extends Error {
  override readonly name = 'ForecastingError';
  constructor(
    readonly code: ForecastingErrorCode,
    readonly fn: string,
    detail: string,
  ) {
    super(`${fn}: ${detail}`);
  }
}

/** Throws unless every value is a finite number. */
export function assertFinite(fn: string, values: ArrayLike<number>, what = 'series'): void {
  for (let i = 0; i < values.length; i++) {
    if (!Number.isFinite(values[i])) {
      throw new ForecastingError('non-finite-input', fn, `${what} has a non-finite value at index ${i}`);
    }
  }
}

/** Throws unless the series has at least `min` observations. */
export function assertLength(fn: string, values: ArrayLike<number>, min: number, why: string): void {
  if (values.length < min) {
    throw new ForecastingError('too-few-observations', fn, `needs at least ${min} observations (${why}), got ${values.length}`);
  }
}

import { ForecastingError } from '../core/errors';
import { householderLeastSquares } from '../core/householder-least-squares';

/** Least-squares coefficients of y on the given columns (no intercept) and (XᵀX)⁻¹ for standard errors. */
export interface LeastSquaresSolution {
  beta: Float64Array;
  /** (XᵀX)⁻¹ as rows; multiply by σ² for the coefficient covariance. */
  unscaledCovariance: number[][];
}

/**
 * Solves min ‖y − Xβ‖² for regressor columns by Householder QR (core/householder-least-squares.ts), not
 * the normal equations, for accuracy with correlated regressors (Golub & Van Loan 2013, Matrix
 * Computations, 4th ed., §5.3). The columns are packed column-major into one Float64Array, which keeps
 * long hourly series free of per-row allocations.
 *
 * @throws ForecastingError 'singular-matrix' when the columns are linearly dependent.
 */
export function leastSquares(fn: string, columns: readonly Float64Array[], y: ArrayLike<number>): LeastSquaresSolution {
  const m = y.length;
  const k = columns.length;
  const design = new Float64Array(m * k);
  columns.forEach((column, j) => design.set(column.subarray(0, m), j * m));
  try {
    const solution = householderLeastSquares(fn, design, m, k, y, false);
    const unscaledCovariance = Array.from({ length: k }, (_, i) => Array.from(solution.unscaledCovariance.subarray(i * k, (i + 1) * k)));
    return { beta: solution.coefficients, unscaledCovariance };
  } catch (error) {
    if (error instanceof ForecastingError && error.code === 'singular-matrix') {
      throw new ForecastingError(
        'singular-matrix',
        fn,
        'the regressors are linearly dependent (e.g. a holiday column with no holiday in the training window, or day types that a profile already carries)',
      );
    }
    throw error;
  }
}

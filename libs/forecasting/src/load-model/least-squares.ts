import { ForecastingError } from '../core/errors';
import { householderLeastSquares, householderLeastSquaresMany } from '../core/householder-least-squares';

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
  return withPlainSingularMessage(fn, () => {
    const solution = householderLeastSquares(fn, pack(columns, m), m, k, y, false);
    return { beta: solution.coefficients, unscaledCovariance: rows(solution.unscaledCovariance, k) };
  });
}

/** The first m rows of the columns, column-major in one array. */
function pack(columns: readonly Float64Array[], m: number): Float64Array {
  const design = new Float64Array(m * columns.length);
  columns.forEach((column, j) => design.set(column.subarray(0, m), j * m));
  return design;
}

/** A k×k row-major matrix as rows. */
function rows(matrix: Float64Array, k: number): number[][] {
  return Array.from({ length: k }, (_, i) => Array.from(matrix.subarray(i * k, (i + 1) * k)));
}

/** Runs `solve`, restating a singular design in the load model's terms. */
function withPlainSingularMessage<T>(fn: string, solve: () => T): T {
  try {
    return solve();
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

/** β̂ of several responses (possibly none) on the same columns from one factorisation, and (XᵀX)⁻¹ as rows (see leastSquares). */
export function leastSquaresMany(
  fn: string,
  columns: readonly Float64Array[],
  ys: ReadonlyArray<ArrayLike<number>>,
): { betas: Float64Array[]; unscaledCovariance: number[][] } {
  const m = ys.length > 0 ? ys[0].length : columns[0].length;
  const k = columns.length;
  return withPlainSingularMessage(fn, () => {
    const solution = householderLeastSquaresMany(fn, pack(columns, m), m, k, ys);
    return { betas: solution.coefficients, unscaledCovariance: rows(solution.unscaledCovariance, k) };
  });
}

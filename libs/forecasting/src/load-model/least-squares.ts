import { Matrix, QrDecomposition, inverse } from 'ml-matrix';
import { ForecastingError } from '../core/errors';

/** Least-squares coefficients of y on the given columns (no intercept) and (XᵀX)⁻¹ for standard errors. */
export interface LeastSquaresSolution {
  beta: Float64Array;
  /** (XᵀX)⁻¹; multiply by σ² for the coefficient covariance. */
  unscaledCovariance: number[][];
}

/**
 * Solves min ‖y − Xβ‖² by Householder QR (ml-matrix), not the normal equations, for accuracy with
 * correlated regressors (Golub & Van Loan 2013, Matrix Computations, 4th ed., §5.3).
 *
 * @throws ForecastingError 'singular-matrix' when the columns are linearly dependent.
 */
export function leastSquares(fn: string, columns: readonly Float64Array[], y: ArrayLike<number>): LeastSquaresSolution {
  const n = y.length;
  const k = columns.length;
  const x = new Matrix(n, k);
  for (let j = 0; j < k; j++) for (let t = 0; t < n; t++) x.set(t, j, columns[j][t]);
  const qr = new QrDecomposition(x);
  if (!qr.isFullRank()) {
    throw new ForecastingError('singular-matrix', fn, 'the regressors are linearly dependent (e.g. day types together with a profile that carries them)');
  }
  const solution = qr.solve(Matrix.columnVector(Array.from(y)));
  const unscaledCovariance = inverse(x.transpose().mmul(x)).to2DArray();
  return { beta: Float64Array.from(solution.getColumn(0)), unscaledCovariance };
}

/**
 * Cholesky factorisation, solve and inverse for the small symmetric positive-definite systems of the
 * ARMA estimators (normal equations of a few parameters), on flat row-major Float64Arrays so the hot
 * Levenberg-Marquardt loop allocates nothing.
 *
 * Method: A = L Lᵀ by the Cholesky-Banachiewicz row order (Golub & Van Loan 2013, Matrix Computations,
 * 4th ed., Algorithm 4.2.1), forward and back substitution.
 *
 * Conventions: `factor` holds L in its lower triangle after `choleskyFactor`; the upper triangle is
 * left untouched garbage and never read.
 *
 * @throws nothing: `choleskyFactor` returns false when a pivot is not positive (not positive definite
 * to working precision).
 *
 * References: Golub & Van Loan (2013) §4.2.
 */

/** Factors the k × k matrix `a` into `factor` (lower triangle); false when not positive definite. */
export function choleskyFactor(a: Float64Array, k: number, factor: Float64Array): boolean {
  for (let i = 0; i < k; i++) {
    for (let j = 0; j <= i; j++) {
      let s = a[i * k + j];
      for (let l = 0; l < j; l++) s -= factor[i * k + l] * factor[j * k + l];
      if (i === j) {
        if (!(s > 0) || !Number.isFinite(s)) return false;
        factor[i * k + i] = Math.sqrt(s);
      } else {
        factor[i * k + j] = s / factor[j * k + j];
      }
    }
  }
  return true;
}

/** Solves L Lᵀ x = b in place (b becomes x) with the factor from choleskyFactor. */
export function choleskySolve(factor: Float64Array, k: number, b: Float64Array): void {
  for (let i = 0; i < k; i++) {
    let s = b[i];
    for (let l = 0; l < i; l++) s -= factor[i * k + l] * b[l];
    b[i] = s / factor[i * k + i];
  }
  for (let i = k - 1; i >= 0; i--) {
    let s = b[i];
    for (let l = i + 1; l < k; l++) s -= factor[l * k + i] * b[l];
    b[i] = s / factor[i * k + i];
  }
}

/** The inverse of the k × k matrix `a`, or null when it is not positive definite. */
export function choleskyInverse(a: Float64Array, k: number): Float64Array | null {
  const factor = new Float64Array(k * k);
  if (!choleskyFactor(a, k, factor)) return null;
  const inverse = new Float64Array(k * k);
  const column = new Float64Array(k);
  for (let c = 0; c < k; c++) {
    column.fill(0);
    column[c] = 1;
    choleskySolve(factor, k, column);
    for (let r = 0; r < k; r++) inverse[r * k + c] = column[r];
  }
  return inverse;
}

/**
 * Householder QR of a tall matrix held as columns, for ridge AR without forming ZᵀZ.
 *
 * Method: Householder reflections column by column (Golub & Van Loan 2013, Matrix Computations, 4th ed., §5.2.2),
 *   applying each to the remaining columns and to a right-hand side, so Qᵀb comes out without storing Q.
 * Conventions: R is returned row-major (k × k, upper triangular); a column that is already zero below and on the
 *   diagonal is left alone (R_jj = 0), which the callers treat as collinearity.
 * References: Golub & Van Loan (2013) §5.1–5.3 (Householder vectors, QR, least squares by QR).
 */

/** R (row-major k × k upper triangular) and the first k entries of Qᵀb. */
export interface QrFactors {
  k: number;
  r: Float64Array;
  qtb: Float64Array;
  /** Σ (Qᵀb)_i² over the rows below k: the least-squares residual sum of squares, the part of ‖b − Aβ‖² no β changes. */
  tailSquares: number;
}

/** Factors the matrix whose columns are `columns` (each of the same length ≥ k) and applies Qᵀ to `rhs`. */
export function householderQr(columns: readonly Float64Array[], rhs: Float64Array): QrFactors {
  const k = columns.length;
  const rows = rhs.length;
  const a = columns.map((c) => Float64Array.from(c));
  const b = Float64Array.from(rhs);
  const r = new Float64Array(k * k);
  for (let j = 0; j < k; j++) {
    const v = a[j];
    let norm2 = 0;
    for (let i = j; i < rows; i++) norm2 += v[i] * v[i];
    const norm = Math.sqrt(norm2);
    if (norm === 0) {
      for (let l = j + 1; l < k; l++) r[j * k + l] = a[l][j];
      continue;
    }
    // The sign of α avoids cancellation in v_j = a_jj − α (Golub & Van Loan 2013, §5.1).
    const alpha = v[j] > 0 ? -norm : norm;
    const head = v[j];
    v[j] = head - alpha; // v now holds the Householder vector in rows j..rows−1
    const vtv = norm2 - head * head + v[j] * v[j];
    const scale = 2 / vtv;
    for (let l = j + 1; l < k; l++) reflect(v, a[l], j, rows, scale);
    reflect(v, b, j, rows, scale);
    r[j * k + j] = alpha;
    for (let l = j + 1; l < k; l++) r[j * k + l] = a[l][j];
  }
  let tailSquares = 0;
  for (let i = k; i < rows; i++) tailSquares += b[i] * b[i];
  return { k, r, qtb: b.subarray(0, k), tailSquares };
}

/** Applies I − scale·vvᵀ (rows j..) to the column `c` in place. */
function reflect(v: Float64Array, c: Float64Array, j: number, rows: number, scale: number): void {
  let s = 0;
  for (let i = j; i < rows; i++) s += v[i] * c[i];
  s *= scale;
  if (s === 0) return;
  for (let i = j; i < rows; i++) c[i] -= s * v[i];
}

/** Solves R β = c by back-substitution (R row-major upper triangular with a non-zero diagonal). */
export function backSubstitute(r: Float64Array, k: number, c: ArrayLike<number>): Float64Array {
  const beta = new Float64Array(k);
  for (let i = k - 1; i >= 0; i--) {
    let s = c[i];
    for (let l = i + 1; l < k; l++) s -= r[i * k + l] * beta[l];
    beta[i] = s / r[i * k + i];
  }
  return beta;
}

/** Inverse of a row-major upper triangular matrix with a non-zero diagonal (itself upper triangular). */
export function invertUpperTriangular(r: Float64Array, k: number): Float64Array {
  const inverse = new Float64Array(k * k);
  for (let col = 0; col < k; col++) {
    const unit = new Float64Array(k);
    unit[col] = 1;
    const x = backSubstitute(r, k, unit);
    for (let i = 0; i < k; i++) inverse[i * k + col] = x[i];
  }
  return inverse;
}

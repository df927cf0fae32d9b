/**
 * Least squares of x_t on 1, x_{t−1}, …, x_{t−p} (t = p+1..n) exploiting the lagged design's shift
 * structure, in O(np + p³) instead of the O(np²) of a dense QR.
 *
 * Method: the columns of a lagged design are shifted copies of one series, so the cross-products
 * XᵀX and Xᵀy follow from one row of lagged sums and a sliding update along each diagonal,
 * G[i+1][j+1] = G[i][j] + z_{p−i−1} z_{p−j−1} − z_{n−i−1} z_{n−j−1} (the "covariance method" of
 * linear prediction: Makhoul 1975, Proc. IEEE 63(4), §3.2). The series is centred first, which makes
 * the intercept column nearly orthogonal to the lags. R is the Cholesky factor of XᵀX (the same R as
 * a QR of X, up to signs), and the solution is refined once by the corrected semi-normal equations,
 * R ᵀR δ = Xᵀ(y − Xβ), which restores QR-grade accuracy while cond(X)²·u < 1 (Björck 1996, Numerical
 * Methods for Least Squares Problems, §2.5.3 and §6.6.5). When the Cholesky pivots say the design is
 * ill-conditioned (ratio of extreme pivots beyond 1e5, so cond(X)² could approach 1/u), it hands the
 * problem to the Householder QR (householder-least-squares.ts), which needs no such bound.
 *
 * Conventions: the result is for the uncentred intercept c (x_t = c + Σ φ_i x_{t−i} + e_t), with
 * residuals e_{p+1..n}, their sum of squares and (XᵀX)⁻¹ of the uncentred design, exactly as the
 * Householder solver reports them.
 *
 * @throws ForecastingError('singular-matrix') for collinear lags (from either path).
 *
 * References: Makhoul (1975); Björck (1996) §2.5, §6.6; Golub & Van Loan (2013) §5.3.
 */
import { ForecastingError } from './errors';
import { householderLeastSquares, type LeastSquaresSolution } from './householder-least-squares';

/** Beyond this ratio of largest to smallest Cholesky pivot the dense QR takes over. */
const conditionLimit = 1e5;
/** Below this ratio of pivots the centred semi-normal solution is already within ~1e-10 of QR (cond² · u ≲ 1e-10), so the refinement pass is skipped. */
const refineAbove = 1e3;
/** Leading zeros before the centred series, so every four-lag group reads inside the array. */
const PAD = 3;

/** Fits x_t on [1, x_{t−1}, …, x_{t−p}] for t = p+1..n. `fn` names the caller in errors. */
export function laggedLeastSquares(fn: string, x: ArrayLike<number>, p: number): LeastSquaresSolution {
  const n = x.length;
  const m = n - p;
  const k = p + 1;
  let mean = 0;
  for (let t = 0; t < n; t++) mean += x[t];
  mean /= n;
  // z after PAD leading zeros: the four-lane loops below then need no case for a last, partial group of lags.
  const padded = new Float64Array(n + PAD);
  const z = padded.subarray(PAD);
  for (let t = 0; t < n; t++) z[t] = x[t] - mean;

  // lag[a*(p+1)+b] = Σ_{r<m} z[r+p−a] z[r+p−b] for a, b = 0..p (a = 0 is the response): four lags per pass
  // over the rows, each z_u loaded once for four products (the same sums, in the same order, as one lag a pass).
  const lag = new Float64Array(k * k);
  for (let b = 0; b <= p; b += 4) {
    let s0 = 0;
    let s1 = 0;
    let s2 = 0;
    let s3 = 0;
    for (let u = p + PAD, v = p - b + PAD, end = n + PAD; u < end; u++, v++) {
      const a = padded[u];
      s0 += a * padded[v];
      s1 += a * padded[v - 1];
      s2 += a * padded[v - 2];
      s3 += a * padded[v - 3];
    }
    const lanes = [s0, s1, s2, s3];
    for (let j = 0; j < 4 && b + j <= p; j++) {
      lag[b + j] = lanes[j];
      lag[(b + j) * k] = lanes[j];
    }
  }
  for (let a = 0; a < p; a++) {
    for (let b = a; b < p; b++) {
      const next = lag[a * k + b] + z[p - a - 1] * z[p - b - 1] - z[n - 1 - a] * z[n - 1 - b];
      lag[(a + 1) * k + b + 1] = next;
      lag[(b + 1) * k + a + 1] = next;
    }
  }
  const sums = new Float64Array(k);
  for (let r = 0; r < m; r++) sums[0] += z[r + p];
  for (let a = 0; a < p; a++) sums[a + 1] = sums[a] + z[p - a - 1] - z[n - 1 - a];

  // Gram matrix of the centred design [1, z_{t−1..t−p}] and its right-hand side.
  const gram = new Float64Array(k * k);
  const rhs = new Float64Array(k);
  gram[0] = m;
  rhs[0] = sums[0];
  for (let i = 1; i <= p; i++) {
    gram[i] = gram[i * k] = sums[i];
    rhs[i] = lag[i * k];
    for (let j = 1; j <= p; j++) gram[i * k + j] = lag[i * k + j];
  }
  const r = cholesky(gram, k);
  const ratio = r ? pivotRatio(r, k, gram) : Infinity;
  if (!r || ratio > conditionLimit) return denseFallback(fn, x, p);

  const beta = solveNormal(r, k, rhs);
  const residuals = new Float64Array(m);
  computeResiduals(padded, p, beta, residuals);
  if (ratio > refineAbove) {
    const correction = solveNormal(r, k, transposeTimes(z, p, residuals));
    for (let i = 0; i < k; i++) beta[i] += correction[i];
    computeResiduals(padded, p, beta, residuals);
  }
  let rss = 0;
  for (let i = 0; i < m; i++) rss += residuals[i] * residuals[i];

  // Back to the uncentred intercept: c = c′ + x̄(1 − Σφ); Cov(c, φ) = J Cov(c′, φ) Jᵀ with ∂c/∂φ_i = −x̄.
  let sumPhi = 0;
  for (let i = 1; i <= p; i++) sumPhi += beta[i];
  const coefficients = Float64Array.from(beta);
  coefficients[0] = beta[0] + mean * (1 - sumPhi);
  const centred = inverseFromCholesky(r, k);
  // J is the identity but for its first row (1, −x̄, …, −x̄), so J C Jᵀ takes O(k²): the same products, summed in
  // the same order, as the full double sum over J's non-zero entries.
  const weight = (col: number) => (col === 0 ? 1 : -mean);
  const unscaledCovariance = new Float64Array(k * k);
  for (let i = 0; i < k; i++) {
    for (let j = 0; j < k; j++) {
      let s = 0;
      if (i > 0 && j > 0) s = 1 * centred[i * k + j] * 1;
      else if (i > 0) for (let b = 0; b < k; b++) s += 1 * centred[i * k + b] * weight(b);
      else if (j > 0) for (let a = 0; a < k; a++) s += weight(a) * centred[a * k + j] * 1;
      else for (let a = 0; a < k; a++) for (let b = 0; b < k; b++) s += weight(a) * centred[a * k + b] * weight(b);
      unscaledCovariance[i * k + j] = s;
    }
  }
  return { coefficients, residuals, rss, unscaledCovariance };
}

/** Upper-triangular R with RᵀR = A, or null when A is not numerically positive definite. */
function cholesky(a: Float64Array, k: number): Float64Array | null {
  const r = new Float64Array(k * k);
  for (let j = 0; j < k; j++) {
    let d = a[j * k + j];
    for (let l = 0; l < j; l++) d -= r[l * k + j] * r[l * k + j];
    if (!(d > 1e-14 * a[j * k + j])) return null;
    const pivot = Math.sqrt(d);
    r[j * k + j] = pivot;
    for (let i = j + 1; i < k; i++) {
      let s = a[j * k + i];
      for (let l = 0; l < j; l++) s -= r[l * k + j] * r[l * k + i];
      r[j * k + i] = s / pivot;
    }
  }
  return r;
}

/**
 * Ratio of the largest to the smallest diagonal entry of R after scaling each column of X to unit length
 * (R_jj/√G_jj): a cheap lower bound on the condition number of the equilibrated design. Column scaling leaves
 * the Cholesky solution's accuracy unchanged (van der Sluis 1969; Higham 2002, Accuracy and Stability of
 * Numerical Algorithms, 2nd ed., §10.1), so the load's units (an intercept of 1 beside lags in MW or kW)
 * must not count as ill-conditioning.
 */
function pivotRatio(r: Float64Array, k: number, gram: Float64Array): number {
  let largest = 0;
  let smallest = Infinity;
  for (let i = 0; i < k; i++) {
    const d = Math.abs(r[i * k + i]) / Math.sqrt(gram[i * k + i]);
    largest = Math.max(largest, d);
    smallest = Math.min(smallest, d);
  }
  return largest / smallest;
}

/** Solves RᵀR β = b. */
function solveNormal(r: Float64Array, k: number, b: Float64Array): Float64Array {
  const w = Float64Array.from(b);
  for (let i = 0; i < k; i++) {
    let s = w[i];
    for (let l = 0; l < i; l++) s -= r[l * k + i] * w[l];
    w[i] = s / r[i * k + i];
  }
  for (let i = k - 1; i >= 0; i--) {
    let s = w[i];
    for (let l = i + 1; l < k; l++) s -= r[i * k + l] * w[l];
    w[i] = s / r[i * k + i];
  }
  return w;
}

/**
 * residuals[r] = z[r+p] − β₀ − Σ β_i z[r+p−i], with z after PAD leading zeros in `padded`: four lags per pass,
 * subtracted in order of i as one lag a pass would (lanes beyond p carry β = 0).
 */
function computeResiduals(padded: Float64Array, p: number, beta: Float64Array, residuals: Float64Array): void {
  const m = residuals.length;
  for (let r = 0; r < m; r++) residuals[r] = padded[r + p + PAD] - beta[0];
  for (let i = 1; i <= p; i += 4) {
    const b0 = beta[i];
    const b1 = i + 1 <= p ? beta[i + 1] : 0;
    const b2 = i + 2 <= p ? beta[i + 2] : 0;
    const b3 = i + 3 <= p ? beta[i + 3] : 0;
    for (let r = 0, v = p - i + PAD; r < m; r++, v++) {
      residuals[r] = residuals[r] - b0 * padded[v] - b1 * padded[v - 1] - b2 * padded[v - 2] - b3 * padded[v - 3];
    }
  }
}

/** Xᵀe for the centred lagged design. */
function transposeTimes(z: Float64Array, p: number, e: Float64Array): Float64Array {
  const out = new Float64Array(p + 1);
  const m = e.length;
  for (let r = 0; r < m; r++) out[0] += e[r];
  for (let i = 1; i <= p; i++) {
    let s = 0;
    for (let r = 0, v = p - i; r < m; r++, v++) s += e[r] * z[v];
    out[i] = s;
  }
  return out;
}

/** (RᵀR)⁻¹ = R⁻¹R⁻ᵀ. */
function inverseFromCholesky(r: Float64Array, k: number): Float64Array {
  const rInverse = new Float64Array(k * k);
  for (let j = 0; j < k; j++) {
    rInverse[j * k + j] = 1 / r[j * k + j];
    for (let i = j - 1; i >= 0; i--) {
      let s = 0;
      for (let l = i + 1; l <= j; l++) s += r[i * k + l] * rInverse[l * k + j];
      rInverse[i * k + j] = -s / r[i * k + i];
    }
  }
  const out = new Float64Array(k * k);
  for (let i = 0; i < k; i++) {
    for (let j = i; j < k; j++) {
      let s = 0;
      for (let l = j; l < k; l++) s += rInverse[i * k + l] * rInverse[j * k + l];
      out[i * k + j] = out[j * k + i] = s;
    }
  }
  return out;
}

/** The dense Householder QR on the explicit design, for ill-conditioned lags. */
function denseFallback(fn: string, x: ArrayLike<number>, p: number): LeastSquaresSolution {
  const n = x.length;
  const m = n - p;
  const k = p + 1;
  const design = new Float64Array(m * k);
  design.fill(1, 0, m);
  for (let i = 1; i <= p; i++) for (let r = 0; r < m; r++) design[i * m + r] = x[r + p - i];
  const y = new Float64Array(m);
  for (let r = 0; r < m; r++) y[r] = x[r + p];
  if (m < k) throw new ForecastingError('invalid-argument', fn, `needs more observations than ${k} columns`);
  return householderLeastSquares(fn, design, m, k, y);
}

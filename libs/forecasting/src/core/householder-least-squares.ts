/**
 * Linear least squares min ‖y − Xβ‖² by a Householder QR decomposition of X.
 *
 * X = QR with Q orthogonal and R upper triangular; β solves Rβ = (Qᵀy)_{1..k}, and
 * (XᵀX)⁻¹ = R⁻¹R⁻ᵀ gives the coefficient covariance without forming XᵀX.
 *
 * Method: Householder triangularisation (Golub & Van Loan 2013, Matrix Computations, 4th ed.,
 * §5.2.2 and §5.3.3, Algorithm 5.3.2): backward stable, error governed by cond(X), whereas the
 * normal equations square it (§5.3.7).
 *
 * Conventions: X is column-major in one Float64Array (k columns of m rows) and is not modified;
 * columns are not pivoted, so a column whose part orthogonal to the previous ones is below
 * 1e-12 of its own norm is reported as collinear.
 *
 * @throws ForecastingError('singular-matrix') for collinear or zero columns; ('invalid-argument')
 *   when m < k or the sizes disagree.
 *
 * References: Golub & Van Loan (2013) §5.2–5.3; Björck (1996), Numerical Methods for Least
 * Squares Problems, §2.4.
 */
import { ForecastingError } from './errors';

/** The least-squares solution and what standard errors need from it. */
export interface LeastSquaresSolution {
  /** β̂, length k. */
  coefficients: Float64Array;
  /** y − Xβ̂, length m (empty, and rss NaN, when asked for without residuals). */
  residuals: Float64Array;
  /** Σ residuals². */
  rss: number;
  /** (XᵀX)⁻¹ = R⁻¹R⁻ᵀ, k×k row-major. */
  unscaledCovariance: Float64Array;
}

/** Relative size below which a column counts as lying in the span of the previous ones. */
const collinearityTolerance = 1e-12;

/** Solves min ‖y − Xβ‖² for X (m×k, column-major) by Householder QR. `fn` names the caller in errors; `withResiduals` false skips the residuals. */
export function householderLeastSquares(
  fn: string,
  design: Float64Array,
  m: number,
  k: number,
  y: ArrayLike<number>,
  withResiduals = true,
): LeastSquaresSolution {
  checkSizes(fn, design, m, k, y.length);
  const qty = Float64Array.from(y);
  const r = triangularise(fn, design, m, k, [qty]);
  const coefficients = backSolve(r, k, qty);
  // Residuals from the original columns, so they are exactly y − Xβ̂ as reported (skipped when the caller needs
  // only β̂ and (XᵀX)⁻¹: for the few columns of a GLS step they cost as much as the factorisation).
  const residuals = withResiduals ? Float64Array.from(y) : new Float64Array(0);
  let rss = Number.NaN;
  if (withResiduals) {
    for (let l = 0; l < k; l++) {
      const b = coefficients[l];
      const col = l * m;
      for (let i = 0; i < m; i++) residuals[i] -= b * design[col + i];
    }
    rss = 0;
    for (let i = 0; i < m; i++) rss += residuals[i] * residuals[i];
  }
  return { coefficients, residuals, rss, unscaledCovariance: covarianceFromR(r, k) };
}

/**
 * β̂ for several right-hand sides of the same X from one factorisation (each Qᵀy costs O(mk), the
 * factorisation O(mk²)), and (XᵀX)⁻¹. Each β̂ is what householderLeastSquares gives for that y alone.
 */
export function householderLeastSquaresMany(
  fn: string,
  design: Float64Array,
  m: number,
  k: number,
  ys: ReadonlyArray<ArrayLike<number>>,
): { coefficients: Float64Array[]; unscaledCovariance: Float64Array } {
  for (const y of ys) checkSizes(fn, design, m, k, y.length);
  const qtys = ys.map((y) => Float64Array.from(y));
  const r = triangularise(fn, design, m, k, qtys);
  return { coefficients: qtys.map((qty) => backSolve(r, k, qty)), unscaledCovariance: covarianceFromR(r, k) };
}

/** Throws unless X is m×k with m ≥ k ≥ 1 and y has m rows. */
function checkSizes(fn: string, design: Float64Array, m: number, k: number, rows: number): void {
  if (design.length !== m * k || rows !== m || m < k || k < 1) {
    throw new ForecastingError(
      'invalid-argument',
      fn,
      `least squares needs an m×k design with m ≥ k ≥ 1 and m responses (m = ${m}, k = ${k})`,
    );
  }
}

/** Householder triangularisation of X (not modified), applying each reflection to every `rhs` in place; returns R (k×k row-major). */
function triangularise(fn: string, design: Float64Array, m: number, k: number, rhs: Float64Array[]): Float64Array {
  const a = design.slice();
  const r = new Float64Array(k * k);
  for (let j = 0; j < k; j++) {
    const col = j * m;
    let originalNorm2 = 0;
    for (let i = 0; i < m; i++) originalNorm2 += design[col + i] * design[col + i];
    let norm2 = 0;
    for (let i = j; i < m; i++) norm2 += a[col + i] * a[col + i];
    const norm = Math.sqrt(norm2);
    if (!(norm > collinearityTolerance * Math.sqrt(originalNorm2))) {
      throw new ForecastingError('singular-matrix', fn, `column ${j} of the design is collinear with the previous columns (or zero)`);
    }
    const alpha = a[col + j] > 0 ? -norm : norm;
    // v = a_j − α e_j stored in place; ‖v‖² = 2(‖a_j‖² − α a_jj).
    const vNorm2 = 2 * (norm2 - alpha * a[col + j]);
    a[col + j] -= alpha;
    for (let l = j + 1; l < k; l++) {
      const other = l * m;
      let s = 0;
      for (let i = j; i < m; i++) s += a[col + i] * a[other + i];
      const f = (2 * s) / vNorm2;
      for (let i = j; i < m; i++) a[other + i] -= f * a[col + i];
      r[j * k + l] = a[other + j];
    }
    for (const qty of rhs) {
      let s = 0;
      for (let i = j; i < m; i++) s += a[col + i] * qty[i];
      const f = (2 * s) / vNorm2;
      for (let i = j; i < m; i++) qty[i] -= f * a[col + i];
    }
    r[j * k + j] = alpha;
  }
  return r;
}

/** Solves Rβ = (Qᵀy)_{1..k} by back substitution. */
function backSolve(r: Float64Array, k: number, qty: Float64Array): Float64Array {
  const coefficients = new Float64Array(k);
  for (let i = k - 1; i >= 0; i--) {
    let sum = qty[i];
    for (let l = i + 1; l < k; l++) sum -= r[i * k + l] * coefficients[l];
    coefficients[i] = sum / r[i * k + i];
  }
  return coefficients;
}

/** (XᵀX)⁻¹ = R⁻¹R⁻ᵀ, k×k row-major: R⁻¹ by back substitution, then the product. */
function covarianceFromR(r: Float64Array, k: number): Float64Array {
  const rInverse = new Float64Array(k * k);
  for (let j = 0; j < k; j++) {
    rInverse[j * k + j] = 1 / r[j * k + j];
    for (let i = j - 1; i >= 0; i--) {
      let sum = 0;
      for (let l = i + 1; l <= j; l++) sum += r[i * k + l] * rInverse[l * k + j];
      rInverse[i * k + j] = -sum / r[i * k + i];
    }
  }
  const unscaledCovariance = new Float64Array(k * k);
  for (let i = 0; i < k; i++) {
    for (let j = i; j < k; j++) {
      let sum = 0;
      for (let l = j; l < k; l++) sum += rInverse[i * k + l] * rInverse[j * k + l];
      unscaledCovariance[i * k + j] = sum;
      unscaledCovariance[j * k + i] = sum;
    }
  }
  return unscaledCovariance;
}

/**
 * Ridge AR over a wide lag set: the MAP estimate under a Gaussian prior on the standardised AR coefficients.
 *
 * Model: (x_t − μ) = Σ_j φ_{L_j} (x_{t−L_j} − μ) + e_t, e_t ~ N(0, σ²) (R's arima sign convention);
 *   `ar` has length max(L) with zeros outside the lag set.
 * Method: on standardised lagged regressors Z and centred response y (the intercept is unpenalised and drops out),
 *   β̃(λ) = argmin ‖y − Zβ‖² + λ‖β‖² = (ZᵀZ + λI)⁻¹Zᵀy (Hoerl & Kennard 1970, Technometrics 12(1); Hastie,
 *   Tibshirani & Friedman 2009, §3.4.1), computed by Householder QR of Z and a second QR of the damped
 *   least-squares matrix [R; √λ I], never forming ZᵀZ (Golub & Van Loan 2013, Matrix Computations, 4th ed., §5.3).
 *   With the prior β̃_j ~ N(0, σ²/λ) iid, the negative log posterior is (‖y − Zβ‖² + λ‖β‖²)/(2σ²), so
 *   β̃(λ) is the MAP estimate. df(λ) = trace of the hat matrix Z(ZᵀZ + λI)⁻¹Zᵀ = Σ d_i²/(d_i² + λ) over the
 *   singular values d_i of Z (ESL eq. 3.50).
 *   λ is chosen by BIC or rolling-origin validation on the grid λ = m·10^a, a = 1, 0.8, …, −6, then λ = 0
 *   (least squares; left out when the lags are collinear), or fixed by the caller.
 * Conventions: λ is on the scale of the unnormalised sum of squares (every standardised column has Σz² = m), so
 *   λ = m shrinks an orthogonal design by half; conditional on the first maxLag values; σ² = RSS/(n − maxLag);
 *   ℓ, AIC, AICc, BIC with k = df + 2 (see regularised-fit.ts); no standard errors (penalised estimates are biased;
 *   `stderr` fields are null).
 * @throws ForecastingError 'invalid-argument' (lags, λ < 0, both `lambda` and `select`); 'too-few-observations'
 *   unless n ≥ maxLag + k + 2; 'non-finite-input'; 'constant-series'; 'singular-matrix' for a fixed λ = 0
 *   on collinear lags; 'non-stationary' when the chosen fit (fixed λ) or every fit on the grid is not
 *   stationary — the function throws rather than returning a model whose mean and forecasts are undefined.
 * References: Hoerl & Kennard (1970); Hastie, Tibshirani & Friedman (2009), The Elements of Statistical Learning,
 *   2nd ed., §3.4.1; Bergmeir, Hyndman & Koo (2018) for validation of autoregressions.
 */
import { ForecastingError } from '../core/errors';
import { backSubstitute, householderQr, invertUpperTriangular, type QrFactors } from './householder-qr';
import { buildLaggedDesign, type LaggedDesign } from './lagged-design';
import { selectPenalty } from './penalty-selection';
import { assembleFit, type RegularisedArOptions, type RegularisedFit, type StandardisedSolution } from './regularised-fit';

const FN = 'ridgeAr';

/** A diagonal entry of R below this share of the largest marks collinear lags. */
const RANK_TOLERANCE = 1e-12;

/** Fits a ridge AR on the given lags, with λ fixed or chosen by BIC (default) or rolling-origin validation. */
export function ridgeAr(x: ArrayLike<number>, options: RegularisedArOptions): RegularisedFit {
  checkPenaltyOptions(FN, options);
  const design = buildLaggedDesign(FN, x, options.lags);
  if (options.lambda !== undefined) {
    const [solution] = ridgePath(design, [options.lambda]);
    return assembleFit(FN, 'ridge', x, design, solution, { selection: 'fixed', path: [], converged: null, iterations: null });
  }
  const grid = ridgeGrid(design);
  const choice = selectPenalty(FN, x, design, grid, ridgePath, options);
  return assembleFit(FN, 'ridge', x, design, choice.solution, {
    selection: options.select ?? 'bic',
    path: choice.path,
    converged: null,
    iterations: null,
  });
}

/** QR factors of each design, kept so the grid check and the path share one factorisation. */
const factorCache = new WeakMap<LaggedDesign, QrFactors>();

/** Householder QR of the standardised design with Qᵀy (memoised per design object). */
function factor(design: LaggedDesign): QrFactors {
  let qr = factorCache.get(design);
  if (!qr) {
    qr = householderQr(design.columns, design.response);
    factorCache.set(design, qr);
  }
  return qr;
}

/** True when some |R_jj| is negligible against the largest, i.e. the lagged columns are collinear. */
function isCollinear(qr: QrFactors): boolean {
  const diagonal = Array.from({ length: qr.k }, (_, j) => Math.abs(qr.r[j * qr.k + j]));
  const largest = Math.max(...diagonal);
  return diagonal.some((value) => value <= RANK_TOLERANCE * largest);
}

/**
 * Ridge solutions at each λ. With Z = QR, β̃(λ) solves the k-row least-squares problem [R; √λ I]β ≈ [Qᵀy; 0]
 * (a second, small QR), which avoids forming ZᵀZ; df(λ) = tr Z(ZᵀZ + λI)⁻¹Zᵀ = ‖R R₂⁻¹‖²_F where R₂ is the
 * triangular factor of the stacked matrix (so R₂ᵀR₂ = RᵀR + λI).
 */
export function ridgePath(design: LaggedDesign, lambdas: readonly number[]): StandardisedSolution[] {
  const qr = factor(design);
  const k = qr.k;
  return lambdas.map((lambda) => {
    if (lambda === 0) {
      if (isCollinear(qr)) {
        throw new ForecastingError('singular-matrix', FN, 'the lagged columns are collinear, so λ = 0 has no unique solution; use λ > 0');
      }
      const beta = backSubstitute(qr.r, k, qr.qtb);
      return { lambda, beta, df: k, rss: residualSum(qr, beta) };
    }
    const root = Math.sqrt(lambda);
    const stacked = Array.from({ length: k }, (_, j) => {
      const column = new Float64Array(2 * k);
      for (let i = 0; i <= j; i++) column[i] = qr.r[i * k + j];
      column[k + j] = root;
      return column;
    });
    const rhs = new Float64Array(2 * k);
    rhs.set(qr.qtb);
    const penalised = householderQr(stacked, rhs);
    const beta = backSubstitute(penalised.r, k, penalised.qtb);
    const inverse = invertUpperTriangular(penalised.r, k);
    let df = 0;
    for (let i = 0; i < k; i++) {
      for (let j = 0; j < k; j++) {
        let s = 0;
        for (let l = i; l <= j; l++) s += qr.r[i * k + l] * inverse[l * k + j];
        df += s * s;
      }
    }
    return { lambda, beta, df, rss: residualSum(qr, beta) };
  });
}

/** ‖y − Zβ‖² = ‖Qᵀy − Rβ‖² over the first k rows plus the rest of Qᵀy, which no β reaches (Golub & Van Loan 2013 §5.3). */
function residualSum(qr: QrFactors, beta: Float64Array): number {
  const k = qr.k;
  let sum = qr.tailSquares;
  for (let i = 0; i < k; i++) {
    let fitted = 0;
    for (let j = i; j < k; j++) fitted += qr.r[i * k + j] * beta[j];
    const difference = qr.qtb[i] - fitted;
    sum += difference * difference;
  }
  return sum;
}

/** The decreasing ridge grid m·10^a, a = 1, 0.8, …, −6, then 0 (least squares) unless the lags are collinear. */
function ridgeGrid(design: LaggedDesign): number[] {
  const grid: number[] = [];
  for (let step = 0; step <= 35; step++) grid.push(design.rows * 10 ** (1 - 0.2 * step));
  if (!isCollinear(factor(design))) grid.push(0);
  return grid;
}

/** Throws unless λ is a finite non-negative number and at most one of `lambda` and `select` is given. */
export function checkPenaltyOptions(fn: string, options: RegularisedArOptions): void {
  if (options.lambda !== undefined) {
    if (!Number.isFinite(options.lambda) || options.lambda < 0) {
      throw new ForecastingError('invalid-argument', fn, `lambda must be a finite number ≥ 0, got ${options.lambda}`);
    }
    if (options.select !== undefined) {
      throw new ForecastingError('invalid-argument', fn, 'pass either a fixed lambda or select, not both');
    }
  }
}

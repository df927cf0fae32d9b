/**
 * Lasso AR over a wide lag set: the MAP estimate under a Laplace prior on the standardised AR coefficients,
 * which benches (sets exactly to zero) the lags that do not earn their place.
 *
 * Model: (x_t − μ) = Σ_j φ_{L_j} (x_{t−L_j} − μ) + e_t, e_t ~ N(0, σ²) (R's arima sign convention);
 *   `ar` has length max(L) with zeros at lags outside the set or benched.
 * Method: on standardised lagged regressors Z (Σz² = m per column) and centred response y, minimise
 *   (1/(2m))‖y − Zβ‖² + λ‖β‖₁ (Tibshirani 1996, J. R. Stat. Soc. B 58(1)) by cyclic coordinate descent with
 *   soft-thresholding, β_j ← S(g_j + G_jj β_j, λ)/G_jj with G = ZᵀZ/m and gradient g = Zᵀ(y − Zβ)/m kept current
 *   by covariance updates, active-set sweeps between full sweeps, an exact solve on each new active set and signs
 *   (active-set-solve.ts; correlated hourly lags otherwise need thousands of sweeps), and warm starts along a decreasing λ path
 *   from λ_max = max_j |Z_jᵀy|/m (all lags benched) to 1e-4·λ_max in 100 log-spaced steps (Friedman, Hastie &
 *   Tibshirani 2010, J. Stat. Softw. 33(1), §2.1–2.5). At each λ the previous λ's active set is first moved to the new
 *   solution exactly by add/drop steps (moveActiveSet; between kinks of the path it is already right), so most
 *   λ need no sweep at all; G and c come from lag shifts of the series (lagged-gram.ts). Under the prior p(β_j) ∝ exp(−(mλ/σ²)|β_j|) the negative log
 *   posterior is (m/σ²) times the objective, so the solution is the MAP estimate (Park & Casella 2008, JASA 103(482)).
 *   df = number of non-zero coefficients, an unbiased estimate of the lasso's degrees of freedom (Zou, Hastie &
 *   Tibshirani 2007, Ann. Statist. 35(5)); λ by BIC or rolling-origin validation, or fixed.
 * Conventions: λ is in the units of the series (a covariance of a standardised lag with the response);
 *   convergence when no coefficient moves by more than `tolerance`·sd(y) in a full sweep, or when the exact
 *   active-set solution passes the KKT check; conditional on the
 *   first maxLag values; σ² = RSS/(n − maxLag); ℓ, AIC, AICc, BIC with k = df + 2 (regularised-fit.ts);
 *   `stderr` null (no simple standard errors for the lasso); `converged` false when a λ ran out of sweeps.
 * @throws ForecastingError 'invalid-argument' (lags, λ < 0, both `lambda` and `select`); 'too-few-observations'
 *   unless n ≥ maxLag + k + 2; 'non-finite-input'; 'constant-series'; 'non-stationary' when the fit at a fixed λ,
 *   or every fit on the path, is not stationary (it throws rather than return an undefined mean).
 * References: Tibshirani (1996); Friedman, Hastie & Tibshirani (2010); Zou, Hastie & Tibshirani (2007);
 *   Park & Casella (2008).
 */
import type { LaggedDesign } from './lagged-design';
import { moveActiveSet, solveActiveSet } from './active-set-solve';
import { buildLaggedDesign } from './lagged-design';
import { laggedGram } from './lagged-gram';
import { selectPenalty } from './penalty-selection';
import { assembleFit, type RegularisedArOptions, type RegularisedFit, type StandardisedSolution } from './regularised-fit';
import { checkPenaltyOptions } from './ridge';

const FN = 'lassoAr';

/** Active-set sweeps between full sweeps. */
const ACTIVE_SWEEPS = 20;
/** Add/drop moves tried from the previous λ's active set before coordinate descent takes over. */
const MOVE_ROUNDS = 12;

/** Lasso options: the shared ones plus the coordinate-descent stopping rule. */
export interface LassoArOptions extends RegularisedArOptions {
  /** Stop when no standardised coefficient moves by more than tolerance·sd(y) in a full sweep (default 1e-12). */
  tolerance?: number;
  /** Sweeps allowed per λ before giving up on that λ (default 10000). */
  maxIterations?: number;
}

/** A lasso path solution plus the sweeps it took. */
interface LassoSolution extends StandardisedSolution {
  converged: boolean;
  iterations: number;
}

/** Fits a lasso AR on the given lags, with λ fixed or chosen by BIC (default) or rolling-origin validation. */
export function lassoAr(x: ArrayLike<number>, options: LassoArOptions): RegularisedFit {
  checkPenaltyOptions(FN, options);
  const design = buildLaggedDesign(FN, x, options.lags);
  gramCache.set(design, laggedGram(design, x));
  const solve = (d: LaggedDesign, lambdas: readonly number[]) => lassoPath(d, lambdas, options, d === design ? x : undefined);
  if (options.lambda !== undefined) {
    const path = lassoPath(design, warmStartGrid(design, options.lambda), options, x);
    const solution = path[path.length - 1];
    return assembleFit(FN, 'lasso', x, design, solution, {
      selection: 'fixed',
      path: [],
      converged: path.every((s) => s.converged),
      iterations: path.reduce((total, s) => total + s.iterations, 0),
    });
  }
  const grid = lassoGrid(design);
  const choice = selectPenalty(FN, x, design, grid, solve, options);
  const chosen = choice.solution as LassoSolution;
  return assembleFit(FN, 'lasso', x, design, chosen, {
    selection: options.select ?? 'bic',
    path: choice.path,
    converged: chosen.converged,
    iterations: chosen.iterations,
  });
}

/** Smallest λ at which every coefficient is zero: max_j |Z_jᵀy|/m. */
export function lassoLambdaMax(design: LaggedDesign): number {
  const moments = gramCache.get(design);
  let max = 0;
  if (moments) for (const c of moments.covariance) max = Math.max(max, Math.abs(c));
  else for (const column of design.columns) max = Math.max(max, Math.abs(dot(column, design.response)) / design.rows);
  return max;
}

/** G and c of the designs lassoAr made, from lag shifts of their series, so the grid and the path share them. */
const gramCache = new WeakMap<LaggedDesign, { gram: Float64Array; covariance: Float64Array }>();

/**
 * Lasso solutions along a decreasing λ grid, each warm-started from the previous one. With `series` (the x the
 * design was built from) the Gram matrix comes from lag shifts of the series (lagged-gram.ts), else from the columns.
 * Each solution carries its residual sum of squares, yᵀy − 2βᵀc·m + βᵀGβ·m, so choosing λ needs no pass over the rows.
 */
export function lassoPath(
  design: LaggedDesign,
  lambdas: readonly number[],
  options: Pick<LassoArOptions, 'tolerance' | 'maxIterations'> = {},
  series?: ArrayLike<number>,
): LassoSolution[] {
  const k = design.lags.length;
  const m = design.rows;
  const { gram, covariance } = gramCache.get(design) ?? (series ? laggedGram(design, series) : columnGram(design)); // c = Zᵀy/m, the gradient at β = 0
  const gradient = Float64Array.from(covariance);
  const yy = dot(design.response, design.response);
  const sdY = Math.sqrt(yy / m);
  const threshold = (options.tolerance ?? 1e-12) * sdY;
  const maxSweeps = options.maxIterations ?? 10_000;
  const beta = new Float64Array(k);

  /** One cyclic pass over `indices`; returns the largest coefficient move. */
  const sweep = (lambda: number, indices: ArrayLike<number>): number => {
    let largest = 0;
    for (let a = 0; a < indices.length; a++) {
      const j = indices[a];
      const gjj = gram[j * k + j];
      const u = gradient[j] + gjj * beta[j];
      const updated = softThreshold(u, lambda) / gjj;
      const delta = updated - beta[j];
      if (delta === 0) continue;
      beta[j] = updated;
      for (let i = 0; i < k; i++) gradient[i] -= gram[i * k + j] * delta;
      largest = Math.max(largest, Math.abs(delta));
    }
    return largest;
  };

  const all = Int32Array.from({ length: k }, (_, j) => j);
  const slack = 1e-10 * sdY;
  return lambdas.map((lambda) => {
    let sweeps = 0;
    let converged = false;
    let triedPattern = '';
    // Between the kinks of the path the active set and its signs stay put (Osborne, Presnell & Turlach 2000): try the
    // exact solution on the warm start's set first, and sweep only when the set has to change.
    if (beta.some((b) => b !== 0)) {
      triedPattern = signPattern(beta);
      const exact = moveActiveSet(gram, k, covariance, beta, lambda, slack, MOVE_ROUNDS);
      if (exact) {
        beta.set(exact.beta);
        gradient.set(exact.gradient);
        converged = true;
      }
    }
    while (!converged && sweeps < maxSweeps) {
      sweeps++;
      if (sweep(lambda, all) <= threshold) {
        converged = true;
        break;
      }
      // After each full sweep, solve its active set exactly (active-set-solve.ts) unless that set was tried already:
      // a solve costs about one sweep, and on the right set it ends what would take coordinate descent hundreds.
      const pattern = signPattern(beta);
      if (pattern !== triedPattern) {
        triedPattern = pattern;
        const exact = solveActiveSet(gram, k, covariance, beta, lambda, slack);
        if (exact) {
          beta.set(exact.beta);
          gradient.set(exact.gradient);
          converged = true;
          break;
        }
      }
      // Iterate on the active set for a while, then return to a full sweep (FHT 2010 §2.6).
      const active = Int32Array.from(all.filter((j) => beta[j] !== 0));
      for (let inner = 0; inner < ACTIVE_SWEEPS && sweeps < maxSweeps; inner++) {
        sweeps++;
        if (sweep(lambda, active) <= threshold) break;
      }
    }
    let df = 0;
    for (let j = 0; j < k; j++) if (beta[j] !== 0) df++;
    return { lambda, beta: Float64Array.from(beta), df, converged, iterations: sweeps, rss: residualSum(gram, k, covariance, beta, yy, m) };
  });
}

/** ‖y − Zβ‖² = yᵀy − 2m·βᵀc + m·βᵀGβ over the non-zero coefficients. */
function residualSum(gram: Float64Array, k: number, covariance: Float64Array, beta: Float64Array, yy: number, m: number): number {
  let linear = 0;
  let quadratic = 0;
  for (let i = 0; i < k; i++) {
    if (beta[i] === 0) continue;
    linear += beta[i] * covariance[i];
    let row = 0;
    for (let j = 0; j < k; j++) if (beta[j] !== 0) row += gram[i * k + j] * beta[j];
    quadratic += beta[i] * row;
  }
  return Math.max(0, yy + m * (quadratic - 2 * linear));
}

/** G = ZᵀZ/m and c = Zᵀy/m from the design's columns. */
function columnGram(design: LaggedDesign): { gram: Float64Array; covariance: Float64Array } {
  const k = design.columns.length;
  const m = design.rows;
  const gram = new Float64Array(k * k);
  const covariance = new Float64Array(k);
  for (let i = 0; i < k; i++) {
    covariance[i] = dot(design.columns[i], design.response) / m;
    for (let j = 0; j <= i; j++) {
      const g = dot(design.columns[i], design.columns[j]) / m;
      gram[i * k + j] = g;
      gram[j * k + i] = g;
    }
  }
  return { gram, covariance };
}

/** Signs of the coefficients as a string, to notice when the active set has settled. */
function signPattern(beta: Float64Array): string {
  let pattern = '';
  for (let j = 0; j < beta.length; j++) pattern += beta[j] > 0 ? '+' : beta[j] < 0 ? '-' : '0';
  return pattern;
}

/** The default path: 100 log-spaced λ from λ_max down to 1e-4·λ_max (glmnet's ratio when rows exceed lags). */
function lassoGrid(design: LaggedDesign): number[] {
  const lambdaMax = lassoLambdaMax(design);
  return Array.from({ length: 100 }, (_, i) => lambdaMax * 10 ** ((-4 * i) / 99));
}

/** Warm-start path for a fixed λ: 20 log-spaced steps from λ_max towards λ, ending exactly at λ. */
function warmStartGrid(design: LaggedDesign, lambda: number): number[] {
  const lambdaMax = lassoLambdaMax(design);
  if (lambda >= lambdaMax) return [lambda];
  const floor = Math.max(lambda, lambdaMax * 1e-4);
  const grid = Array.from({ length: 20 }, (_, i) => lambdaMax * (floor / lambdaMax) ** (i / 19));
  if (grid[grid.length - 1] !== lambda) grid.push(lambda);
  return grid;
}

/** Soft-thresholding operator S(u, λ) = sign(u)·max(|u| − λ, 0). */
export function softThreshold(u: number, lambda: number): number {
  if (u > lambda) return u - lambda;
  if (u < -lambda) return u + lambda;
  return 0;
}

/** Dot product of two equal-length arrays. */
function dot(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i] * b[i];
  return s;
}

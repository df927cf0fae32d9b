/**
 * Chooses the penalty λ of a regularised AR along a decreasing grid, by BIC or by rolling-origin validation.
 *
 * Model: x_t = c + Σ_j φ_{L_j} x_{t−L_j} + e_t (R's arima sign convention, c = μ(1 − Σφ)).
 * Method: BIC(λ) = −2ℓ(λ) + log(n − maxLag)(df(λ) + 2) on the full series (Zou, Hastie & Tibshirani 2007,
 *   Ann. Statist. 35(5) for the lasso df; trace of the hat matrix for ridge). Rolling-origin validation: the last
 *   `validationFraction` of the usable rows is cut into `folds` consecutive blocks; for each block the path is
 *   refitted on everything before it and scored by one-step-ahead squared errors inside the block (conditional
 *   forecasts from the observed lags), as in Bergmeir, Hyndman & Koo (2018), Comput. Stat. Data Anal. 120,
 *   and Tashman (2000), Int. J. Forecasting 16(4).
 * Conventions: only λ whose full-series fit is stationary can be chosen; ties go to the larger λ (the sparser
 *   or more shrunk model), the earlier one on the decreasing grid. Stationarity (an O(p²) test, p = 168 with a
 *   weekly lag) is checked from the best score up until a stationary fit is met, so the path marks the fits
 *   scoring better than the chosen one non-stationary, the chosen one stationary and the rest unchecked (null).
 * @throws ForecastingError 'non-stationary' when no λ on the grid gives a stationary fit; 'too-few-observations'
 *   when the first validation block leaves too little to fit; 'invalid-argument' for bad fold settings.
 * References: Zou, Hastie & Tibshirani (2007); Bergmeir, Hyndman & Koo (2018); Tashman (2000).
 */
import { ForecastingError } from '../core/errors';
import { isCausalAr } from '../core/ar-stationarity';
import { buildLaggedDesign, type LaggedDesign } from './lagged-design';
import {
  backTransform,
  criteria,
  residualSumOfSquares,
  type PenaltyPathPoint,
  type RegularisedArOptions,
  type StandardisedSolution,
} from './regularised-fit';

/** Solves the standardised problem at each λ of a decreasing grid (warm starts are the solver's business). */
export type PathSolver = (design: LaggedDesign, lambdas: readonly number[]) => StandardisedSolution[];

/** The chosen solution on the full series and the scored path. */
export interface PenaltyChoice {
  solution: StandardisedSolution;
  path: PenaltyPathPoint[];
}

/** Picks λ from `grid` (decreasing) by BIC or rolling-origin validation, as the file comment describes. */
export function selectPenalty(
  fn: string,
  x: ArrayLike<number>,
  design: LaggedDesign,
  grid: readonly number[],
  solvePath: PathSolver,
  options: RegularisedArOptions,
): PenaltyChoice {
  const selection = options.select ?? 'bic';
  const validationMse = selection === 'validation' ? rollingOriginMse(fn, x, design, grid, solvePath, options) : null;
  const solutions = solvePath(design, grid);
  const bics = solutions.map((solution) => {
    const rss = solution.rss ?? residualSumOfSquares(design, solution.beta);
    return rss > 0 ? criteria(rss, design.rows, solution.df).bic : null;
  });
  const scores = selection === 'validation' ? validationMse! : bics;
  const ranked = solutions.map((_, i) => i).filter((i) => scores[i] !== null);
  ranked.sort((a, b) => scores[a]! - scores[b]! || a - b);
  const stationary: Array<boolean | null> = solutions.map(() => null);
  let best = -1;
  for (const i of ranked) {
    stationary[i] = isCausalAr(backTransform(design, solutions[i].beta).ar);
    if (stationary[i]) {
      best = i;
      break;
    }
  }
  const path: PenaltyPathPoint[] = solutions.map((solution, i) => ({
    lambda: solution.lambda,
    df: solution.df,
    bic: stationary[i] === false ? null : bics[i],
    validationMse: validationMse ? validationMse[i] : null,
    stationary: stationary[i],
  }));
  if (best < 0) {
    throw new ForecastingError(
      'non-stationary',
      fn,
      'no penalty on the grid gives a stationary AR fit; difference the series (lag 24 or 168) or remove its profile first',
    );
  }
  return { solution: solutions[best], path };
}

/** Mean squared one-step validation error for each λ of the grid over the rolling-origin blocks. */
function rollingOriginMse(
  fn: string,
  x: ArrayLike<number>,
  design: LaggedDesign,
  grid: readonly number[],
  solvePath: PathSolver,
  options: RegularisedArOptions,
): number[] {
  const folds = options.folds ?? 5;
  const fraction = options.validationFraction ?? 0.2;
  if (!Number.isInteger(folds) || folds < 1)
    throw new ForecastingError('invalid-argument', fn, `folds must be a positive integer, got ${folds}`);
  if (!(fraction > 0 && fraction < 1))
    throw new ForecastingError('invalid-argument', fn, `validationFraction must lie in (0, 1), got ${fraction}`);
  const blockSize = Math.floor((fraction * design.rows) / folds);
  if (blockSize < 1) {
    throw new ForecastingError(
      'too-few-observations',
      fn,
      `validation needs at least ${folds} held-out rows; use fewer folds or a longer series`,
    );
  }
  const n = x.length;
  const firstOrigin = n - folds * blockSize;
  const sse = new Array<number>(grid.length).fill(0);
  for (let fold = 0; fold < folds; fold++) {
    const origin = firstOrigin + fold * blockSize;
    const train = Float64Array.from({ length: origin }, (_, i) => x[i]);
    const foldDesign = buildLaggedDesign(fn, train, design.lags);
    const solutions = solvePath(foldDesign, grid);
    solutions.forEach((solution, i) => {
      const { ar, intercept } = backTransform(foldDesign, solution.beta);
      for (let t = origin; t < origin + blockSize; t++) {
        let forecast = intercept;
        for (const lag of design.lags) forecast += ar[lag - 1] * x[t - lag];
        const e = x[t] - forecast;
        sse[i] += e * e;
      }
    });
  }
  return sse.map((s) => s / (folds * blockSize));
}

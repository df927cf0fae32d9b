/**
 * Reconciliation matrices G (m × n): coherent bottom-level forecasts b̃ = G ŷ from the n base forecasts ŷ,
 * so that every level of ỹ = S G ŷ adds up.
 *
 * Methods:
 * - bottom-up: G = [0 | I_m], the bottom-level base forecasts summed (Hyndman & Athanasopoulos 2021, §11.2).
 * - top-down by proportions of the historical averages: G = p e_rootᵀ with p_j = Σ_t b_jt / Σ_t y_root,t
 *   (Gross & Sohl 1990, method F; Hyndman & Athanasopoulos 2021, §11.2 "Proportions of the historical
 *   averages").
 * - minimum trace (MinT): G = (Sᵀ W⁻¹ S)⁻¹ Sᵀ W⁻¹, the unbiased G that minimises tr(S G W_h Gᵀ Sᵀ), the
 *   total variance of the reconciled errors, for W the covariance of the base-forecast errors
 *   (Wickramasuriya, Athanasopoulos & Hyndman 2019, Theorem 1, eq. 9); with W from shrinkCovariance it is
 *   their "MinT(Shrink)".
 *
 * Conventions: rows of ŷ and columns of G follow `SummingStructure.keys`; columns of S and rows of G follow
 * `bottomKeys`. Reconciled values may fall below zero for a small remainder series: clamping would break the
 * sums, so they are left as they are and the caller decides what to show.
 *
 * @throws ForecastingError('invalid-argument') for a history or covariance of the wrong shape, or a root with
 *   zero historical total; 'singular-matrix' when W or Sᵀ W⁻¹ S cannot be inverted.
 *
 * References: Wickramasuriya, Athanasopoulos & Hyndman (2019), JASA 114(526):804–819; Hyndman &
 * Athanasopoulos (2021), Forecasting: Principles and Practice, 3rd ed., §11.2–11.3; Gross & Sohl (1990),
 * J. Forecasting 9(3):233–254.
 */
import { CholeskyDecomposition, Matrix } from 'ml-matrix';
import { assertFinite, ForecastingError } from '../core/errors';
import type { SummingStructure } from './summing-matrix';

/** G = [0 | I]: each bottom series keeps its own base forecast. */
export function bottomUpMatrix(structure: SummingStructure): Matrix {
  const g = Matrix.zeros(structure.bottomKeys.length, structure.keys.length);
  const row = new Map(structure.keys.map((k, i) => [k, i]));
  structure.bottomKeys.forEach((key, j) => g.set(j, row.get(key)!, 1));
  return g;
}

/** The proportions p_j = Σ_t b_jt / Σ_t y_root,t from aligned histories (`history[i]` for `keys[i]`). */
export function historicalProportions(structure: SummingStructure, history: ArrayLike<number>[]): number[] {
  const fn = 'historicalProportions';
  if (history.length !== structure.keys.length) {
    throw new ForecastingError('invalid-argument', fn, `needs one history per series (${structure.keys.length}), got ${history.length}`);
  }
  history.forEach((h, i) => assertFinite(fn, h, `history of ${structure.keys[i]}`));
  const total = (values: ArrayLike<number>): number => {
    let sum = 0;
    for (let k = 0; k < values.length; k++) sum += values[k];
    return sum;
  };
  const row = new Map(structure.keys.map((k, i) => [k, i]));
  const rootIndex = structure.keys.findIndex((k) => structure.parentOf.get(k) === null);
  const rootTotal = total(history[rootIndex]);
  if (rootTotal === 0)
    throw new ForecastingError('invalid-argument', fn, `the root ${structure.keys[rootIndex]} has a zero historical total`);
  return structure.bottomKeys.map((key) => total(history[row.get(key)!]) / rootTotal);
}

/** G = p e_rootᵀ: the root's base forecast split by historical proportions. */
export function topDownMatrix(structure: SummingStructure, history: ArrayLike<number>[]): Matrix {
  const p = historicalProportions(structure, history);
  const rootIndex = structure.keys.findIndex((k) => structure.parentOf.get(k) === null);
  const g = Matrix.zeros(structure.bottomKeys.length, structure.keys.length);
  p.forEach((share, j) => g.set(j, rootIndex, share));
  return g;
}

/** G = (Sᵀ W⁻¹ S)⁻¹ Sᵀ W⁻¹ for an n × n positive-definite error covariance W. */
export function minTraceMatrix(s: Matrix, w: Matrix): Matrix {
  const fn = 'minTraceMatrix';
  if (w.rows !== s.rows || w.columns !== s.rows) {
    throw new ForecastingError('invalid-argument', fn, `W must be ${s.rows} × ${s.rows}, got ${w.rows} × ${w.columns}`);
  }
  // Symmetric in exact arithmetic; products taken in different orders can differ in the last bit.
  const wChol = new CholeskyDecomposition(w.clone().add(w.transpose()).mul(0.5));
  if (!wChol.isPositiveDefinite()) throw new ForecastingError('singular-matrix', fn, 'the error covariance W is not positive definite');
  const wInvS = wChol.solve(s.clone()); // W⁻¹ S, n × m
  const product = s.transpose().mmul(wInvS); // Sᵀ W⁻¹ S, m × m, symmetric up to rounding
  const normal = product.add(product.transpose()).mul(0.5);
  const normalChol = new CholeskyDecomposition(normal);
  if (!normalChol.isPositiveDefinite()) throw new ForecastingError('singular-matrix', fn, 'Sᵀ W⁻¹ S is not positive definite');
  // (Sᵀ W⁻¹ S)⁻¹ (W⁻¹ S)ᵀ, using the symmetry of W.
  return normalChol.solve(wInvS.transpose());
}

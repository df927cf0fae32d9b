/**
 * Coherent forecasts of a whole hierarchy, point and interval, hour by hour: ỹ_h = S G ŷ_h.
 *
 * Method (points): see reconciliation-matrix.ts (bottom-up, top-down by historical proportions, MinT with the
 * Schäfer–Strimmer shrunk covariance of Wickramasuriya, Athanasopoulos & Hyndman 2019).
 *
 * Method (intervals): the base forecasts at horizon h are taken as Gaussian, ŷ_h ~ N(y_h, Σ_h), with
 *   Σ_h = D_h^{1/2} R D_h^{1/2}: D_h the squared standard errors each base model reports at h and R the
 *   correlation matrix of the shrunk one-step error covariance (identity when no errors are given). A linear
 *   map keeps a Gaussian Gaussian, so the reconciled forecast is N(S G ŷ_h, S G Σ_h Gᵀ Sᵀ) (Wickramasuriya
 *   et al. 2019, Lemma 1; Panagiotelis, Gamakumara, Athanasopoulos & Hyndman 2023, EJOR 306(2), §3, Gaussian
 *   reconciliation), and each series' band is ỹ ± z·√diag(S G Σ_h Gᵀ Sᵀ) with z = Φ⁻¹(1/2 + level/200). Taking
 *   the correlations from one-step errors and the scale from each model's h-step error is the paper's
 *   assumption W_h = k_h W_1 (§2.3) relaxed to one k_h per series.
 *
 * Conventions: bands are symmetric about the reconciled mean, so lower ≤ mean ≤ upper always holds and wider
 * levels nest the narrower; the bounds themselves do not add up across levels (quantiles of a sum are not sums
 * of quantiles), the means do.
 *
 * @throws ForecastingError('invalid-argument') for inputs not matching the structure or levels outside (0, 100);
 *   'non-finite-input' for non-finite forecasts or standard errors.
 *
 * References: Wickramasuriya, Athanasopoulos & Hyndman (2019), JASA 114(526):804–819; Panagiotelis et al.
 * (2023), Probabilistic forecast reconciliation: properties, evaluation and score optimisation, EJOR 306(2).
 */
import { Matrix } from 'ml-matrix';
import { assertFinite, ForecastingError } from '../core/errors';
import { normalQuantile } from '../core/normal';
import { bottomUpMatrix, minTraceMatrix, topDownMatrix } from './reconciliation-matrix';
import { shrinkCovariance } from './shrink-covariance';
import type { SummingStructure } from './summing-matrix';

/** How the hierarchy is made to add up. */
export type ReconciliationMethod = 'bottom-up' | 'top-down' | 'min-trace';

/** Every reconciliation method, in the order a planner is offered them. */
export const reconciliationMethods: ReconciliationMethod[] = ['bottom-up', 'top-down', 'min-trace'];

/** Base forecasts of every series, aligned with `structure.keys`. */
export interface HierarchyBaseForecasts {
  /** mean[i][h]: base forecast of series keys[i] at horizon h + 1. */
  mean: ArrayLike<number>[];
  /** se[i][h]: its standard error. */
  se: ArrayLike<number>[];
  /** In-sample one-step errors of each series, aligned in time; needed by min-trace, used for correlations. */
  errors?: ArrayLike<number>[];
  /** History of each series, aligned in time; needed by top-down. */
  history?: ArrayLike<number>[];
  /**
   * Standard deviations to give the errors' covariance instead of their own: W = diag(s) R* diag(s), with R*
   * the correlation of the shrunk covariance. For errors taken from a benchmark (their correlations) when the
   * base models' own error scales are known.
   */
  errorScale?: ArrayLike<number>;
}

/** One reconciled band. */
export interface ReconciledInterval {
  level: number;
  lower: Float64Array;
  upper: Float64Array;
}

/** The coherent forecasts, aligned with `structure.keys`. */
export interface ReconciledHierarchy {
  method: ReconciliationMethod;
  mean: Float64Array[];
  se: Float64Array[];
  /** intervals[i]: the bands of series keys[i], one per requested level. */
  intervals: ReconciledInterval[][];
  /** The m × n matrix G used. */
  g: Matrix;
  /** Shrinkage intensity λ when errors were given. */
  lambda: number | null;
}

/** Reconciles base forecasts of a hierarchy by `method`; see the file comment. */
export function reconcileForecasts(
  structure: SummingStructure,
  base: HierarchyBaseForecasts,
  method: ReconciliationMethod,
  levels: number[] = [80, 95],
): ReconciledHierarchy {
  const fn = 'reconcileForecasts';
  const n = structure.keys.length;
  if (base.mean.length !== n || base.se.length !== n) {
    throw new ForecastingError('invalid-argument', fn, `needs a forecast and standard errors for each of ${n} series`);
  }
  const horizon = base.mean[0].length;
  for (let i = 0; i < n; i++) {
    if (base.mean[i].length !== horizon || base.se[i].length !== horizon) {
      throw new ForecastingError('invalid-argument', fn, `series ${structure.keys[i]} has a horizon other than ${horizon}`);
    }
    assertFinite(fn, base.mean[i], `forecast of ${structure.keys[i]}`);
    assertFinite(fn, base.se[i], `standard errors of ${structure.keys[i]}`);
  }
  for (const level of levels) {
    if (!(level > 0 && level < 100)) throw new ForecastingError('invalid-argument', fn, `levels are percentages in (0, 100), got ${level}`);
  }
  if (base.errors && base.errors.length !== n) throw new ForecastingError('invalid-argument', fn, `needs errors for each of ${n} series`);
  const shrunk = base.errors ? shrinkCovariance(base.errors) : null;
  const correlation = Matrix.eye(n);
  if (shrunk) {
    const c = shrunk.covariance;
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) correlation.set(i, j, c.get(i, j) / Math.sqrt(c.get(i, i) * c.get(j, j)));
  }
  let w = shrunk?.covariance ?? null;
  if (w && base.errorScale) {
    const scale = base.errorScale;
    if (scale.length !== n) throw new ForecastingError('invalid-argument', fn, `needs an error scale for each of ${n} series`);
    for (let i = 0; i < n; i++) {
      if (!(scale[i] > 0 && Number.isFinite(scale[i]))) {
        throw new ForecastingError('invalid-argument', fn, `error scale of ${structure.keys[i]} must be finite and > 0, got ${scale[i]}`);
      }
    }
    w = new Matrix(n, n);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) w.set(i, j, correlation.get(i, j) * scale[i] * scale[j]);
  }
  let g: Matrix;
  if (method === 'bottom-up') g = bottomUpMatrix(structure);
  else if (method === 'top-down') {
    if (!base.history) throw new ForecastingError('invalid-argument', fn, 'top-down needs the history of every series');
    g = topDownMatrix(structure, base.history);
  } else {
    if (!w) throw new ForecastingError('invalid-argument', fn, 'min-trace needs the in-sample errors of every series');
    g = minTraceMatrix(structure.s, w);
  }
  const sg = structure.s.mmul(g); // n × n
  const mean = Array.from({ length: n }, () => new Float64Array(horizon));
  const se = Array.from({ length: n }, () => new Float64Array(horizon));
  const yHat = new Matrix(n, 1);
  const sigma = new Matrix(n, n);
  for (let h = 0; h < horizon; h++) {
    for (let i = 0; i < n; i++) yHat.set(i, 0, base.mean[i][h]);
    const reconciled = sg.mmul(yHat);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) sigma.set(i, j, correlation.get(i, j) * base.se[i][h] * base.se[j][h]);
    }
    const variance = sg.mmul(sigma).mmul(sg.transpose());
    for (let i = 0; i < n; i++) {
      mean[i][h] = reconciled.get(i, 0);
      // Rounding can leave a zero variance a hair below zero.
      se[i][h] = Math.sqrt(Math.max(0, variance.get(i, i)));
    }
  }
  const intervals = mean.map((m, i) =>
    levels.map((level) => {
      const z = normalQuantile(0.5 + level / 200);
      const lower = new Float64Array(horizon);
      const upper = new Float64Array(horizon);
      for (let h = 0; h < horizon; h++) {
        lower[h] = m[h] - z * se[i][h];
        upper[h] = m[h] + z * se[i][h];
      }
      return { level, lower, upper };
    }),
  );
  return { method, mean, se, intervals, g, lambda: shrunk?.lambda ?? null };
}

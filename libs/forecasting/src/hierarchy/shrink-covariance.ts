/**
 * Covariance of base-forecast errors across a hierarchy, shrunk toward its diagonal (Schäfer–Strimmer), as
 * the minimum-trace reconciliation needs it.
 *
 * Model: e_t ∈ ℝⁿ, t = 1..T, the in-sample one-step errors of the n base forecasts, assumed mean zero.
 *
 * Method: Ŵ = (1/T) Σ_t e_t e_tᵀ; target D = diag(Ŵ); W* = λ D + (1 − λ) Ŵ with
 *   λ = Σ_{i≠j} Var(r_ij) / Σ_{i≠j} r_ij², clamped to [0, 1], where r_ij are the sample correlations and
 *   Var(r_ij) = 1/(T(T − 1)) · (Σ_t x_ti² x_tj² − (Σ_t x_ti x_tj)²/T) with x_ti = e_ti / √Ŵ_ii
 *   (Schäfer & Strimmer 2005, target "D", §2 and Table 1; used by Wickramasuriya, Athanasopoulos & Hyndman
 *   2019, §3, eq. for λ̂_D). The variance formula is the one the paper's authors ship in the R package hts
 *   (function shrink.estim), so results match it to rounding.
 *
 * Conventions: errors are not demeaned (the paper's Ŵ₁ is an uncentred second moment); divisor T, not
 *   T − 1, as in the paper; λ = 1 (the diagonal) when every off-diagonal correlation is zero.
 *
 * @throws ForecastingError('invalid-argument') for series of different lengths or fewer than 2 series;
 *   'too-few-observations' for T < 2; 'non-finite-input' for a non-finite error; 'constant-series' for a
 *   series whose errors are all zero (its variance would make W singular).
 *
 * References: Schäfer & Strimmer (2005), Stat. Appl. Genet. Mol. Biol. 4(1) art. 32; Wickramasuriya,
 * Athanasopoulos & Hyndman (2019), JASA 114(526):804–819, §3.
 */
import { Matrix } from 'ml-matrix';
import { assertFinite, ForecastingError } from '../core/errors';

/** The shrunk covariance and the intensity chosen. */
export interface ShrunkCovariance {
  /** W* = λ D + (1 − λ) Ŵ, n × n. */
  covariance: Matrix;
  /** λ in [0, 1]: 1 keeps only the diagonal, 0 the sample covariance. */
  lambda: number;
  /** The unshrunk second moment Ŵ. */
  sample: Matrix;
}

/** Schäfer–Strimmer shrinkage of the error covariance toward its diagonal; `errors[i]` is series i's errors. */
export function shrinkCovariance(errors: ArrayLike<number>[]): ShrunkCovariance {
  const fn = 'shrinkCovariance';
  const n = errors.length;
  if (n < 2) throw new ForecastingError('invalid-argument', fn, `needs at least 2 series, got ${n}`);
  const t = errors[0].length;
  if (t < 2) throw new ForecastingError('too-few-observations', fn, `needs at least 2 errors per series, got ${t}`);
  errors.forEach((e, i) => {
    if (e.length !== t) throw new ForecastingError('invalid-argument', fn, `series ${i} has ${e.length} errors, series 0 has ${t}`);
    assertFinite(fn, e, `errors of series ${i}`);
  });
  const sample = new Matrix(n, n);
  for (let i = 0; i < n; i++) {
    for (let j = i; j < n; j++) {
      let sum = 0;
      for (let k = 0; k < t; k++) sum += errors[i][k] * errors[j][k];
      sample.set(i, j, sum / t);
      sample.set(j, i, sum / t);
    }
    if (!(sample.get(i, i) > 0)) throw new ForecastingError('constant-series', fn, `series ${i} has only zero errors`);
  }
  const scale = Array.from({ length: n }, (_, i) => Math.sqrt(sample.get(i, i)));
  let varianceSum = 0;
  let correlationSquareSum = 0;
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      let crossSquare = 0;
      let cross = 0;
      for (let k = 0; k < t; k++) {
        const x = (errors[i][k] / scale[i]) * (errors[j][k] / scale[j]);
        cross += x;
        crossSquare += x * x;
      }
      varianceSum += (crossSquare - (cross * cross) / t) / (t * (t - 1));
      const r = sample.get(i, j) / (scale[i] * scale[j]);
      correlationSquareSum += r * r;
    }
  }
  const lambda = correlationSquareSum === 0 ? 1 : Math.min(1, Math.max(0, varianceSum / correlationSquareSum));
  const covariance = new Matrix(n, n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) covariance.set(i, j, i === j ? sample.get(i, i) : (1 - lambda) * sample.get(i, j));
  }
  return { covariance, lambda, sample };
}

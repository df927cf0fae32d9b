/**
 * Shared shapes of libs/forecasting.
 *
 * Sign convention, for definiteness and as in R's `arima`:
 *   (x_t − μ) = Σ_{i=1..p} φ_i (x_{t−i} − μ) + e_t + Σ_{j=1..q} θ_j e_{t−j},   e_t ~ iid N(0, σ²).
 * Every estimator returns its coefficients in this convention.
 */

/** The estimators the engine offers, by their published names. */
export type FitMethod = 'yule-walker' | 'cmle' | 'nls' | 'ridge' | 'lasso';

/** The parameters of an ARMA(p, q) model in the sign convention above. */
export interface ArmaParameters {
  /** Process mean μ. */
  mean: number;
  /** φ_1..φ_p. Sparse lag sets (regularised AR) hold zeros at lags that were benched. */
  ar: number[];
  /** θ_1..θ_q. */
  ma: number[];
  /** Innovation variance σ². */
  sigma2: number;
}

/** A fitted model: parameters plus what the estimator reports about them. Unknowns are null. */
export interface FitResult extends ArmaParameters {
  method: FitMethod;
  /** AR order (for regularised AR, the largest lag in the lag set). */
  p: number;
  q: number;
  /** Observations used, including those conditioned on. */
  n: number;
  stderr: { ar: number[] | null; ma: number[] | null; mean: number | null };
  loglik: number | null;
  aic: number | null;
  aicc: number | null;
  bic: number | null;
  /** Iterative estimators only. */
  converged: boolean | null;
  iterations: number | null;
  /** One-step residuals e_1..e_n; the conditioned-on leading values are 0 (as R's CSS returns them). */
  residuals: Float64Array;
}

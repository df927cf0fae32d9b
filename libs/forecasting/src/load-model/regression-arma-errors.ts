/**
 * Regression with ARMA errors for hourly load, optionally with additive slot effects (a seasonal profile).
 *
 * Model: y_t = s(slot_t) + β'z_t + u_t, with (u_t − μ) = Σ φ_i (u_{t−i} − μ) + e_t + Σ θ_j e_{t−j}
 * (R `arima` sign convention), s centred (count-weighted mean 0), μ the level.
 *
 * Method: iterated feasible GLS (Brockwell & Davis 2016, Introduction to Time Series and Forecasting,
 * 3rd ed., §6.6, the iterative scheme for regression with ARMA errors; for AR errors this is the
 * Cochrane-Orcutt procedure, Cochrane & Orcutt 1949, JASA 44(245)). Start from OLS (with the slot
 * effects swept out by within-slot demeaning, the Frisch-Waugh-Lovell theorem); then repeat:
 * (1) slot effects = centred slot means of y − Zβ; (2) fit the ARMA part to u = y − s − Zβ with the chosen
 * estimator; (3) prewhiten y − s and every z_j with the fitted ARMA filter (the CSS recursion: condition on
 * the first p values, pre-sample errors zero) and regress the prewhitened y on the prewhitened Z. For CSS
 * (nls) errors, step (3) minimises the same conditional sum of squares as step (2), so the scheme is
 * block-coordinate descent on the joint CSS. Stops when max |Δβ| ≤ 1e-8·(1 + max |β|), at most 50 passes.
 *
 * Conventions: no intercept column (μ carries the level); the slot effects are re-estimated by plain slot
 * means, not GLS (consistent, as OLS is under ARMA errors; the profile is what planners read). β standard
 * errors are GLS ones σ²(Z̃'Z̃)⁻¹ with the ARMA parameters treated as known.
 *
 * @throws ForecastingError 'singular-matrix' for linearly dependent regressors; whatever the ARMA
 *   estimator throws.
 *
 * References: Brockwell & Davis (2016) §6.6; Cochrane & Orcutt (1949); Davidson & MacKinnon (2004),
 * Econometric Theory and Methods, §7.8 (iterated feasible GLS with AR errors).
 */
import { armaResiduals } from '../core/arma-filter';
import type { FitResult } from '../core/types';
import { estimateSeasonalProfile, type ProfileSlot, type SeasonalProfile } from '../seasonal/seasonal-profile';
import { leastSquares } from './least-squares';

const FN = 'fitRegressionArmaErrors';
const TOLERANCE = 1e-8;
const MAX_PASSES = 50;

/** Additive slot effects estimated alongside the regression. */
export interface SlotEffects {
  slots: ArrayLike<number>;
  slot: ProfileSlot;
}

/** The estimated regression, slot effects and ARMA error model. */
export interface RegressionArmaFit {
  beta: Float64Array;
  /** GLS standard errors of β. */
  betaStderr: Float64Array;
  /** The additive profile of y − Zβ, or null without slot effects. */
  profile: SeasonalProfile | null;
  /** The ARMA fit of the errors u. */
  errors: FitResult;
  /** u = y − s − Zβ, the series the ARMA part was fitted to. */
  remainder: Float64Array;
  iterations: number;
  converged: boolean;
}

/** Fits y = s(slot) + Zβ + u with ARMA errors u by iterated feasible GLS (see the file comment). */
export function fitRegressionArmaErrors(
  y: Float64Array,
  columns: readonly Float64Array[],
  fitErrors: (u: Float64Array) => FitResult,
  slotEffects: SlotEffects | null = null,
): RegressionArmaFit {
  const k = columns.length;
  let beta: Float64Array = k > 0 ? initialOls(y, columns, slotEffects) : new Float64Array(0);
  let passes = 0;
  let converged = k === 0;
  for (;;) {
    passes++;
    const { profile, remainder } = splitRemainder(y, columns, beta, slotEffects);
    const errors = fitErrors(remainder);
    if (k === 0 || converged || passes > MAX_PASSES) {
      const betaStderr = k > 0 ? glsStep(y, columns, profile, slotEffects, errors).stderr : new Float64Array(0);
      return { beta, betaStderr, profile, errors, remainder, iterations: passes, converged };
    }
    const next = glsStep(y, columns, profile, slotEffects, errors).beta;
    let change = 0;
    let size = 0;
    for (let j = 0; j < k; j++) {
      change = Math.max(change, Math.abs(next[j] - beta[j]));
      size = Math.max(size, Math.abs(next[j]));
    }
    beta = next;
    converged = change <= TOLERANCE * (1 + size);
  }
}

/** y − Zβ, split into slot effects (if any) and the remainder u. */
function splitRemainder(y: Float64Array, columns: readonly Float64Array[], beta: Float64Array, slotEffects: SlotEffects | null): { profile: SeasonalProfile | null; remainder: Float64Array } {
  const r = Float64Array.from(y);
  for (let j = 0; j < columns.length; j++) for (let t = 0; t < r.length; t++) r[t] -= beta[j] * columns[j][t];
  if (!slotEffects) return { profile: null, remainder: r };
  const profile = estimateSeasonalProfile(r, slotEffects.slots, slotEffects.slot, 'additive');
  for (let t = 0; t < r.length; t++) r[t] -= profile.effect[slotEffects.slots[t]];
  return { profile, remainder: r };
}

/** OLS start: with slot effects, regress within-slot demeaned y on within-slot demeaned Z (FWL); else with an intercept. */
function initialOls(y: Float64Array, columns: readonly Float64Array[], slotEffects: SlotEffects | null): Float64Array {
  const sweep = (v: Float64Array): Float64Array => {
    if (!slotEffects) {
      const mean = v.reduce((a, b) => a + b, 0) / v.length;
      return v.map((value) => value - mean);
    }
    const profile = estimateSeasonalProfile(v, slotEffects.slots, slotEffects.slot, 'additive');
    return v.map((value, t) => value - profile.level - profile.effect[slotEffects.slots[t]]);
  };
  return leastSquares(FN, columns.map(sweep), sweep(y)).beta;
}

/** One GLS step: prewhiten y − s and the columns with the ARMA filter and regress. */
function glsStep(y: Float64Array, columns: readonly Float64Array[], profile: SeasonalProfile | null, slotEffects: SlotEffects | null, errors: FitResult): { beta: Float64Array; stderr: Float64Array } {
  const target = profile && slotEffects ? y.map((v, t) => v - profile.effect[slotEffects.slots[t]]) : y;
  const whiteTarget = armaResiduals(target, errors.mean, errors.ar, errors.ma);
  const whiteColumns = columns.map((z) => armaResiduals(z, 0, errors.ar, errors.ma));
  const { beta, unscaledCovariance } = leastSquares(FN, whiteColumns, whiteTarget);
  const stderr = Float64Array.from(unscaledCovariance, (row, j) => Math.sqrt(errors.sigma2 * row[j]));
  return { beta, stderr };
}

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
 * the first p values, pre-sample errors zero) and regress the prewhitened y on the prewhitened Z. With slot
 * effects, steps (1) and (3) are solved together for fixed ARMA parameters: β ↦ GLS(y − s(y − Zβ)) is
 * affine, β ↦ c + Aβ (the centred slot means s are linear: y − s(y − Zβ) = (y − s(y)) + Σ β_j s(z_j)), so its
 * fixed point β = (I − A)⁻¹c comes from one GLS factorisation with k + 1 right-hand sides instead of a slow
 * alternation; s(y) and s(z_j) do not depend on the ARMA part and are computed once. For CSS (nls) errors, step (3) minimises the same conditional sum of squares as step (2),
 * so the scheme is block-coordinate descent on the joint CSS. Stops when the distance to the fixed point is
 * at most 1e-8·(1 + max |β|): when max |Δβ| is, or when the a-posteriori bound of a contraction,
 * q/(1 − q)·max |Δβ| with q the ratio of the last two steps (Banach fixed-point theorem; Ortega & Rheinboldt 1970,
 * Iterative Solution of Nonlinear Equations in Several Variables, §12.1), is, once q < 0.5; at most 50 passes.
 *
 * Conventions: no intercept column in Z (μ carries the level; the GLS step estimates a constant beside β and
 * drops it, see prewhitenColumns); the slot effects are re-estimated by plain slot
 * means, not GLS (consistent, as OLS is under ARMA errors; the profile is what planners read). β standard
 * errors are GLS ones, σ² times the β block of (Z̃'Z̃)⁻¹ with the prewhitened constant in Z̃, the ARMA
 * parameters treated as known.
 *
 * @throws ForecastingError 'singular-matrix' for linearly dependent regressors; whatever the ARMA
 *   estimator throws.
 *
 * References: Brockwell & Davis (2016) §6.6; Cochrane & Orcutt (1949); Davidson & MacKinnon (2004),
 * Econometric Theory and Methods, §7.8 (iterated feasible GLS with AR errors).
 */
import { armaResiduals, prewhiten } from '../core/arma-filter';
import { assertFinite, ForecastingError } from '../core/errors';
import type { FitResult } from '../core/types';
import { estimateSeasonalProfile, type ProfileSlot, type SeasonalProfile } from '../seasonal/seasonal-profile';
import { leastSquares, leastSquaresMany } from './least-squares';

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
  // Checked once here: the GLS steps prewhiten these many times without checking again.
  assertFinite(FN, y);
  columns.forEach((column, j) => assertFinite(FN, column, `regressor ${j}`));
  const targets = slotEffects && k > 0 ? glsTargets(y, columns, slotEffects) : [y];
  let beta: Float64Array = k > 0 ? initialOls(y, columns, slotEffects) : new Float64Array(0);
  let passes = 0;
  let converged = k === 0;
  let previousChange = Number.NaN;
  for (;;) {
    passes++;
    const { profile, remainder } = splitRemainder(y, columns, beta, slotEffects);
    const errors = fitErrors(remainder);
    if (k === 0 || converged || passes > MAX_PASSES) {
      // The standard errors need the prewhitened regressors only, not the targets.
      const betaStderr = k > 0 ? glsStep(columns, [], errors).stderr : new Float64Array(0);
      return { beta, betaStderr, profile, errors, remainder, iterations: passes, converged };
    }
    const next = glsStep(columns, targets, errors).beta;
    let change = 0;
    let size = 0;
    for (let j = 0; j < k; j++) {
      change = Math.max(change, Math.abs(next[j] - beta[j]));
      size = Math.max(size, Math.abs(next[j]));
    }
    beta = next;
    const tolerance = TOLERANCE * (1 + size);
    const ratio = change / previousChange;
    converged = change <= tolerance || (ratio < 0.5 && (change * ratio) / (1 - ratio) <= tolerance);
    previousChange = change;
  }
}

/** y − Zβ, split into slot effects (if any) and the remainder u. */
function splitRemainder(
  y: Float64Array,
  columns: readonly Float64Array[],
  beta: ArrayLike<number>,
  slotEffects: SlotEffects | null,
): { profile: SeasonalProfile | null; remainder: Float64Array } {
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
    const out = new Float64Array(v.length);
    if (!slotEffects) {
      let mean = 0;
      for (let t = 0; t < v.length; t++) mean += v[t];
      mean /= v.length;
      for (let t = 0; t < v.length; t++) out[t] = v[t] - mean;
      return out;
    }
    const { level, effect } = estimateSeasonalProfile(v, slotEffects.slots, slotEffects.slot, 'additive');
    const slots = slotEffects.slots;
    for (let t = 0; t < v.length; t++) out[t] = v[t] - level - effect[slots[t]];
    return out;
  };
  return leastSquares(FN, columns.map(sweep), sweep(y)).beta;
}

/** The GLS responses with slot effects: y − s(y), then s(z_j) for each column (s = the centred slot means, per hour). */
function glsTargets(y: Float64Array, columns: readonly Float64Array[], slotEffects: SlotEffects): Float64Array[] {
  const slots = slotEffects.slots;
  const slotPart = (v: Float64Array): Float64Array => {
    const { effect } = estimateSeasonalProfile(v, slots, slotEffects.slot, 'additive');
    const out = new Float64Array(v.length);
    for (let t = 0; t < v.length; t++) out[t] = effect[slots[t]];
    return out;
  };
  const base = slotPart(y);
  for (let t = 0; t < y.length; t++) base[t] = y[t] - base[t];
  return [base, ...columns.map(slotPart)];
}

/**
 * One GLS step for fixed ARMA parameters: prewhiten the columns (with a constant) and every target, solve them
 * all from one factorisation (with no targets, the standard errors alone). Without slot effects β is the GLS solution for y; with them the fixed point of
 * β ↦ c + Aβ (c from y − s(y), column j of A from s(z_j)). Standard errors: σ² times the β block of (Z̃ᵀZ̃)⁻¹.
 */
function glsStep(
  columns: readonly Float64Array[],
  targets: readonly Float64Array[],
  errors: FitResult,
): { beta: Float64Array; stderr: Float64Array } {
  const k = columns.length;
  const white = prewhitenColumns(columns, errors);
  const solution = leastSquaresMany(
    FN,
    white,
    targets.map((target) => prewhiten(target, errors.ar, errors.ma)),
  );
  const stderr = Float64Array.from({ length: k }, (_, j) => Math.sqrt(errors.sigma2 * solution.unscaledCovariance[j][j]));
  if (targets.length === 0) return { beta: new Float64Array(0), stderr };
  const c = solution.betas[0].subarray(0, k);
  if (targets.length === 1) return { beta: Float64Array.from(c), stderr };
  // (I − A) with column j of A the GLS coefficients of s(z_j).
  const system = Array.from({ length: k }, (_, i) =>
    Float64Array.from({ length: k }, (_, j) => (i === j ? 1 : 0) - solution.betas[j + 1][i]),
  );
  return { beta: solveSmall(system, c), stderr };
}

/**
 * The regressors and a constant, prewhitened by the ARMA filter. The constant lets μ move with β inside
 * the GLS step (its coefficient is discarded; the ARMA fit re-estimates μ): holding μ fixed there would make
 * β and μ converge by slow alternation whenever a regressor has a non-zero mean, as degree-hours do.
 */
function prewhitenColumns(columns: readonly Float64Array[], errors: FitResult): Float64Array[] {
  const n = columns.length > 0 ? columns[0].length : 0;
  const white = columns.map((z) => prewhiten(z, errors.ar, errors.ma));
  white.push(errors.ma.length === 0 ? whiteConstantAr(n, errors.ar) : armaResiduals(new Float64Array(n).fill(1), 0, errors.ar, errors.ma));
  return white;
}

/**
 * The constant prewhitened by a pure AR filter, as armaResiduals makes it without a pass over the hours: 0 for
 * the first p hours, then 1 − φ_1 − φ_2 − … (subtracted in the same order, so the same bits).
 */
function whiteConstantAr(n: number, ar: ArrayLike<number>): Float64Array {
  const p = ar.length;
  let value = 1;
  for (let i = 0; i < p; i++) if (ar[i] !== 0) value -= ar[i];
  const white = new Float64Array(n);
  if (p < n) white.fill(value, p);
  return white;
}

/** Solves a small dense system by Gaussian elimination with partial pivoting. */
function solveSmall(matrix: Float64Array[], rhs: Float64Array): Float64Array {
  const k = rhs.length;
  const a = matrix.map((row) => Float64Array.from(row));
  const b = Float64Array.from(rhs);
  for (let col = 0; col < k; col++) {
    let pivot = col;
    for (let row = col + 1; row < k; row++) if (Math.abs(a[row][col]) > Math.abs(a[pivot][col])) pivot = row;
    if (!(Math.abs(a[pivot][col]) > 1e-12)) {
      throw new ForecastingError(
        'singular-matrix',
        FN,
        'the regressors cannot be separated from the slot effects (a regressor constant within every slot?)',
      );
    }
    [a[col], a[pivot]] = [a[pivot], a[col]];
    [b[col], b[pivot]] = [b[pivot], b[col]];
    for (let row = col + 1; row < k; row++) {
      const factor = a[row][col] / a[col][col];
      for (let j = col; j < k; j++) a[row][j] -= factor * a[col][j];
      b[row] -= factor * b[col];
    }
  }
  const x = new Float64Array(k);
  for (let row = k - 1; row >= 0; row--) {
    let sum = b[row];
    for (let j = row + 1; j < k; j++) sum -= a[row][j] * x[j];
    x[row] = sum / a[row][row];
  }
  return x;
}

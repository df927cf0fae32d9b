/**
 * The conditional sum of squares of an ARMA(p, q) model and its analytic derivatives by recursive filtering.
 *
 * Model: (x_t − μ) = Σ_{i=1..p} φ_i (x_{t−i} − μ) + e_t + Σ_{j=1..q} θ_j e_{t−j}  (R's `arima` signs).
 * With w_t = x_t − μ the one-step residuals are e_t = w_t − Σ φ_i w_{t−i} − Σ θ_j e_{t−j} and
 * CSS = Σ_{t=p+1..n} e_t².
 *
 * Method: differentiating the recursion gives recursions of the same form (Box, Jenkins, Reinsel &
 * Ljung 2016, Time Series Analysis, 5th ed., §7.2.1–7.2.2, "derivatives by recursive calculation"):
 *   ∂e_t/∂φ_i = −w_{t−i} − Σ_j θ_j ∂e_{t−j}/∂φ_i
 *   ∂e_t/∂θ_j = −e_{t−j} − Σ_l θ_l ∂e_{t−l}/∂θ_j
 *   ∂e_t/∂μ   = −(1 − Σ_i φ_i) − Σ_l θ_l ∂e_{t−l}/∂μ
 * One fused pass computes e_t, the row of the Jacobian J and accumulates JᵀJ and Jᵀe, so the
 * Levenberg-Marquardt step never stores J beyond the q rows the recursion looks back on.
 *
 * Conventions: conditional on the first p observations: e_1..e_p = 0 (returned as 0, as R's
 * `arima(method = "CSS")` does) and all their derivatives 0; pre-sample innovations are 0. The
 * parameter vector is ordered [φ_1..φ_p, θ_1..θ_q, μ] (μ only when the mean is estimated).
 *
 * @throws nothing; a non-finite sum (overflow of an explosive trial point) is returned as Infinity
 * for the caller to reject.
 *
 * References: Box, Jenkins, Reinsel & Ljung (2016) §7.1.2, §7.2; R `stats` arima.c (ARIMA_CSS).
 */
import { compiledPass } from './css-compiled';

/** Which parameters a CSS parameter vector holds: [φ_1..φ_p, θ_1..θ_q, μ?]. */
export interface CssLayout {
  p: number;
  q: number;
  /** When false μ is fixed at 0 and not part of the vector. */
  includeMean: boolean;
}

/** Number of entries in a parameter vector of this layout. */
export function cssParameterCount(layout: CssLayout): number {
  return layout.p + layout.q + (layout.includeMean ? 1 : 0);
}

/**
 * The conditional sum of squares at `beta`; writes e_1..e_n into `residuals` (length n, leading
 * p entries 0). Returns Infinity when the recursion overflows.
 */
export function cssSumOfSquares(x: Float64Array, beta: Float64Array, layout: CssLayout, residuals: Float64Array): number {
  const { p, q } = layout;
  const n = x.length;
  const mu = layout.includeMean ? beta[p + q] : 0;
  let sum = 0;
  for (let t = 0; t < p; t++) residuals[t] = 0;
  for (let t = p; t < n; t++) {
    let e = x[t] - mu;
    for (let i = 0; i < p; i++) e -= beta[i] * (x[t - 1 - i] - mu);
    // Residuals before t = p are zero (conditioned on or pre-sample), so those terms drop out.
    const reach = q < t - p ? q : t - p;
    for (let j = 0; j < reach; j++) e -= beta[p + j] * residuals[t - 1 - j];
    residuals[t] = e;
    sum += e * e;
  }
  return Number.isFinite(sum) ? sum : Infinity;
}

/** Buffers reused across Levenberg-Marquardt iterations so a fit allocates once. */
export interface CssWorkspace {
  layout: CssLayout;
  /** Jacobian rows ∂e_t/∂β in a ring of q + 1 rows (the recursion reads back only q), k per row. */
  derivatives: Float64Array;
  /** Second-derivative rows ∂²e_t/∂β_a∂β_b over the packed pairs a ≤ b, same ring, k(k+1)/2 per row. */
  secondDerivatives: Float64Array;
  residuals: Float64Array;
  /** Packed pair index → a and b. */
  pairA: Int32Array;
  pairB: Int32Array;
  /** The constant term of each pair's recursion (1 for (φ_i, μ), else 0). */
  pairConstant: Float64Array;
  /** Cross terms −∂e_{t−lag}/∂β_column of pairs involving θ_{lag+1}: pair index, lag, column. */
  crossPair: Int32Array;
  crossLag: Int32Array;
  crossColumn: Int32Array;
  /** Σ e_t ∂²e_t/∂β_a∂β_b over the packed pairs. */
  packedCurvature: Float64Array;
  /** Ring offsets of the rows t−1..t−q during a pass (first and second derivatives). */
  backRow: Int32Array;
  backRow2: Int32Array;
}

/** Allocates the buffers for a series of length n under `layout`. */
export function createCssWorkspace(n: number, layout: CssLayout): CssWorkspace {
  const { p, q, includeMean } = layout;
  const k = cssParameterCount(layout);
  const kk = (k * (k + 1)) / 2;
  const pairA = new Int32Array(kk);
  const pairB = new Int32Array(kk);
  const pairConstant = new Float64Array(kk);
  const cross: Array<[number, number, number]> = [];
  const isMa = (c: number) => c >= p && c < p + q;
  let idx = 0;
  for (let a = 0; a < k; a++) {
    for (let b = a; b < k; b++) {
      pairA[idx] = a;
      pairB[idx] = b;
      // ∂/∂μ of ∂e_t/∂φ_i = −(x_{t−i} − μ) is +1.
      pairConstant[idx] = includeMean && b === p + q && a < p ? 1 : 0;
      if (isMa(a)) cross.push([idx, a - p, b]);
      if (isMa(b)) cross.push([idx, b - p, a]);
      idx++;
    }
  }
  return {
    layout,
    derivatives: new Float64Array((q + 1) * k),
    secondDerivatives: new Float64Array((q + 1) * kk),
    residuals: new Float64Array(n),
    pairA,
    pairB,
    pairConstant,
    crossPair: Int32Array.from(cross, (entry) => entry[0]),
    crossLag: Int32Array.from(cross, (entry) => entry[1]),
    crossColumn: Int32Array.from(cross, (entry) => entry[2]),
    packedCurvature: new Float64Array(kk),
    backRow: new Int32Array(q),
    backRow2: new Int32Array(q),
  };
}

/**
 * One fused pass at `beta`: returns the CSS and fills `jtj` (k × k, row-major, symmetric) with JᵀJ
 * and `jte` (k) with Jᵀe, J = ∂e/∂β over t = p+1..n. When `hessian` is given it also receives half
 * the exact Hessian of the CSS, JᵀJ + Σ e_t ∇²e_t, from the second-derivative recursions
 *   ∂²e_t/∂β_a∂β_b = [a = φ_i, b = μ] − Σ_j θ_j ∂²e_{t−j}/∂β_a∂β_b
 *                    − [a = θ_j] ∂e_{t−j}/∂β_b − [b = θ_j] ∂e_{t−j}/∂β_a
 * (differentiate the recursion of ∂e_t once more; φ-φ and μ-μ terms are identically 0).
 * Returns Infinity on overflow. `workspace` must have been created for the same n and layout.
 * Small models run a compiled, unrolled version of this loop (./css-compiled.ts), which leaves
 * `workspace.residuals` untouched; residuals come from cssSumOfSquares.
 */
export function cssNormalEquations(
  x: Float64Array,
  beta: Float64Array,
  workspace: CssWorkspace,
  jtj: Float64Array,
  jte: Float64Array,
  hessian: Float64Array | null = null,
): number {
  const compiled = compiledPass(workspace.layout, hessian !== null);
  if (compiled !== null) return compiled(x, beta, jtj, jte, hessian);
  return genericNormalEquations(x, beta, workspace, jtj, jte, hessian);
}

/** The loop behind cssNormalEquations for any layout (also writes e_1..e_n into workspace.residuals). */
export function genericNormalEquations(
  x: Float64Array,
  beta: Float64Array,
  workspace: CssWorkspace,
  jtj: Float64Array,
  jte: Float64Array,
  hessian: Float64Array | null,
): number {
  const { p, q, includeMean } = workspace.layout;
  const k = p + q + (includeMean ? 1 : 0);
  const kk = (k * (k + 1)) / 2;
  const n = x.length;
  const mu = includeMean ? beta[p + q] : 0;
  const e = workspace.residuals;
  const d = workspace.derivatives;
  const s2 = workspace.secondDerivatives;
  const { pairA, pairB, pairConstant, crossPair, crossLag, crossColumn, backRow, backRow2 } = workspace;
  const crossCount = crossPair.length;
  const curvature = workspace.packedCurvature;
  const second = hessian !== null;
  jtj.fill(0);
  jte.fill(0);
  curvature.fill(0);
  let oneMinusSumPhi = 1;
  for (let i = 0; i < p; i++) oneMinusSumPhi -= beta[i];
  for (let t = 0; t < p; t++) e[t] = 0;
  // Ring of q + 1 rows: row t lives in slot t mod (q + 1); rows before p are never read (reach).
  const ring = q + 1;
  let slot = 0;
  let sum = 0;
  for (let t = p; t < n; t++) {
    const row = slot * k;
    const reach = q < t - p ? q : t - p;
    for (let j = 0; j < reach; j++) {
      const back = slot - 1 - j < 0 ? slot - 1 - j + ring : slot - 1 - j;
      backRow[j] = back * k;
      backRow2[j] = back * kk;
    }
    // Residual and the direct terms of each derivative.
    let et = x[t] - mu;
    for (let i = 0; i < p; i++) {
      const lagged = x[t - 1 - i] - mu;
      et -= beta[i] * lagged;
      d[row + i] = -lagged;
    }
    for (let j = 0; j < q; j++) d[row + p + j] = j < reach ? -e[t - 1 - j] : 0;
    if (includeMean) d[row + p + q] = -oneMinusSumPhi;
    if (second) {
      // Uses rows t−1..t−q of the first derivatives, so it runs before row t's feedback below.
      const row2 = slot * kk;
      for (let idx = 0; idx < kk; idx++) s2[row2 + idx] = pairConstant[idx];
      for (let j = 0; j < reach; j++) {
        const theta = beta[p + j];
        const back2 = backRow2[j];
        for (let idx = 0; idx < kk; idx++) s2[row2 + idx] -= theta * s2[back2 + idx];
      }
      for (let c = 0; c < crossCount; c++) {
        const lag = crossLag[c];
        if (lag < reach) s2[row2 + crossPair[c]] -= d[backRow[lag] + crossColumn[c]];
      }
    }
    // Moving-average feedback, shared by the residual and every first derivative.
    for (let j = 0; j < reach; j++) {
      const theta = beta[p + j];
      const back = backRow[j];
      et -= theta * e[t - 1 - j];
      for (let c = 0; c < k; c++) d[row + c] -= theta * d[back + c];
    }
    e[t] = et;
    sum += et * et;
    for (let a = 0; a < k; a++) {
      const da = d[row + a];
      jte[a] += da * et;
      const base = a * k;
      for (let b = a; b < k; b++) jtj[base + b] += da * d[row + b];
    }
    if (second) {
      const row2 = slot * kk;
      for (let idx = 0; idx < kk; idx++) curvature[idx] += et * s2[row2 + idx];
    }
    slot = slot + 1 === ring ? 0 : slot + 1;
  }
  for (let a = 0; a < k; a++) for (let b = 0; b < a; b++) jtj[a * k + b] = jtj[b * k + a];
  if (second) {
    for (let idx = 0; idx < kk; idx++) {
      const a = pairA[idx];
      const b = pairB[idx];
      hessian[a * k + b] = jtj[a * k + b] + curvature[idx];
      hessian[b * k + a] = hessian[a * k + b];
    }
  }
  return Number.isFinite(sum) ? sum : Infinity;
}

/**
 * Exact lasso solution on a settled active set, to finish coordinate descent on ill-conditioned lags.
 *
 * Method: on the active set A with signs s_A, the lasso stationarity conditions of
 *   (1/(2m))‖y − Zβ‖² + λ‖β‖₁ read G_AA β_A = c_A − λ s_A (G = ZᵀZ/m, c = Zᵀy/m), a linear system solved here by
 *   Cholesky; the candidate is the lasso solution iff sign(β_A) = s_A and |c_j − G_jA β_A| ≤ λ off the active set
 *   (Osborne, Presnell & Turlach 2000, IMA J. Numer. Anal. 20(3), the active-set / homotopy view of the lasso;
 *   Tibshirani 2013, Electron. J. Statist. 7, for uniqueness). Coordinate descent finds the active set quickly
 *   but then converges slowly when lags are highly correlated, as hourly load lags are; this step ends it exactly.
 * Conventions: returns null when the active set is empty, G_AA is not positive definite, a sign flips or a KKT
 *   condition fails, so the caller keeps iterating; `slack` absorbs rounding in the KKT check.
 * References: Osborne, Presnell & Turlach (2000); Friedman, Hastie & Tibshirani (2010); Golub & Van Loan (2013)
 *   §4.2 (Cholesky).
 */

/** The exact solution on the active set of `beta` if it satisfies the lasso KKT conditions, else null. */
export function solveActiveSet(
  gram: Float64Array,
  k: number,
  c: Float64Array,
  beta: Float64Array,
  lambda: number,
  slack: number,
): { beta: Float64Array; gradient: Float64Array } | null {
  const active: number[] = [];
  for (let j = 0; j < k; j++) if (beta[j] !== 0) active.push(j);
  const a = active.length;
  if (a === 0) return null;
  // Cholesky factor L (row-major a × a, lower) of G_AA.
  const l = new Float64Array(a * a);
  for (let i = 0; i < a; i++) {
    for (let j = 0; j <= i; j++) {
      let s = gram[active[i] * k + active[j]];
      for (let p = 0; p < j; p++) s -= l[i * a + p] * l[j * a + p];
      if (i === j) {
        if (!(s > 0)) return null;
        l[i * a + i] = Math.sqrt(s);
      } else {
        l[i * a + j] = s / l[j * a + j];
      }
    }
  }
  const rhs = active.map((j) => c[j] - lambda * Math.sign(beta[j]));
  const z = new Float64Array(a);
  for (let i = 0; i < a; i++) {
    let s = rhs[i];
    for (let p = 0; p < i; p++) s -= l[i * a + p] * z[p];
    z[i] = s / l[i * a + i];
  }
  const solution = new Float64Array(a);
  for (let i = a - 1; i >= 0; i--) {
    let s = z[i];
    for (let p = i + 1; p < a; p++) s -= l[p * a + i] * solution[p];
    solution[i] = s / l[i * a + i];
  }
  const candidate = new Float64Array(k);
  for (let i = 0; i < a; i++) {
    if (Math.sign(solution[i]) !== Math.sign(beta[active[i]])) return null;
    candidate[active[i]] = solution[i];
  }
  const gradient = new Float64Array(k);
  for (let j = 0; j < k; j++) {
    let s = c[j];
    for (let i = 0; i < a; i++) s -= gram[j * k + active[i]] * solution[i];
    gradient[j] = s;
    if (candidate[j] === 0 && Math.abs(s) > lambda + slack) return null;
  }
  return { beta: candidate, gradient };
}

/**
 * The lasso solution at λ found by moving the active set from the signs of `start` (the previous λ's solution):
 * solve on the set, drop every coefficient whose sign flipped, else add the inactive lag that breaks its KKT
 * condition the most with the sign of its gradient, and repeat (the add/drop steps of the homotopy method,
 * Osborne, Presnell & Turlach 2000, taken in one jump to λ). Returns only a solution that passes the same checks
 * as solveActiveSet, so it is the lasso solution; null when `maxRounds` moves do not reach one or G_AA is not
 * positive definite, and the caller falls back to coordinate descent.
 */
export function moveActiveSet(
  gram: Float64Array,
  k: number,
  c: Float64Array,
  start: Float64Array,
  lambda: number,
  slack: number,
  maxRounds: number,
): { beta: Float64Array; gradient: Float64Array } | null {
  const signs = Float64Array.from(start, Math.sign);
  for (let round = 0; round < maxRounds; round++) {
    const solution = solveOnSet(gram, k, c, signs, lambda);
    if (!solution) return null;
    let flipped = false;
    for (let j = 0; j < k; j++) {
      if (signs[j] !== 0 && Math.sign(solution[j]) !== signs[j]) {
        signs[j] = 0;
        flipped = true;
      }
    }
    if (flipped) continue;
    // Signs hold: the gradient c − G_·A β_A, and the inactive lag that breaks |g_j| ≤ λ the most (solveActiveSet's check).
    const gradient = new Float64Array(k);
    let worst = -1;
    let worstExcess = slack;
    for (let j = 0; j < k; j++) {
      let g = c[j];
      for (let i = 0; i < k; i++) if (signs[i] !== 0) g -= gram[j * k + i] * solution[i];
      gradient[j] = g;
      if (signs[j] === 0 && Math.abs(g) - lambda > worstExcess) {
        worstExcess = Math.abs(g) - lambda;
        worst = j;
      }
    }
    if (worst < 0) return { beta: solution, gradient };
    signs[worst] = Math.sign(gradient[worst]);
  }
  return null;
}

/** The unconstrained solution of G_AA β_A = c_A − λ s_A on the set and signs `signs` (zeros elsewhere), or null when G_AA is not positive definite. */
function solveOnSet(gram: Float64Array, k: number, c: Float64Array, signs: Float64Array, lambda: number): Float64Array | null {
  const active: number[] = [];
  for (let j = 0; j < k; j++) if (signs[j] !== 0) active.push(j);
  const a = active.length;
  const out = new Float64Array(k);
  if (a === 0) return out;
  const l = new Float64Array(a * a);
  for (let i = 0; i < a; i++) {
    for (let j = 0; j <= i; j++) {
      let s = gram[active[i] * k + active[j]];
      for (let p = 0; p < j; p++) s -= l[i * a + p] * l[j * a + p];
      if (i === j) {
        if (!(s > 0)) return null;
        l[i * a + i] = Math.sqrt(s);
      } else {
        l[i * a + j] = s / l[j * a + j];
      }
    }
  }
  const z = new Float64Array(a);
  for (let i = 0; i < a; i++) {
    let s = c[active[i]] - lambda * signs[active[i]];
    for (let p = 0; p < i; p++) s -= l[i * a + p] * z[p];
    z[i] = s / l[i * a + i];
  }
  for (let i = a - 1; i >= 0; i--) {
    let s = z[i];
    for (let p = i + 1; p < a; p++) s -= l[p * a + i] * out[active[p]];
    out[active[i]] = s / l[i * a + i];
  }
  return out;
}

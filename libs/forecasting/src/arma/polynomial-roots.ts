/**
 * Roots of the AR and MA lag polynomials, the stationarity/invertibility tests, and root reflection.
 *
 * Model: (x_t − μ) = Σ φ_i (x_{t−i} − μ) + e_t + Σ θ_j e_{t−j}, i.e. φ(B)(x_t − μ) = θ(B) e_t with
 * φ(z) = 1 − φ_1 z − … − φ_p z^p and θ(z) = 1 + θ_1 z + … + θ_q z^q (R's `arima` sign convention).
 *
 * Method: the model is stationary when every zero of φ(z) lies outside the unit circle and invertible
 * when every zero of θ(z) does (Brockwell & Davis 2016, Introduction to Time Series and Forecasting,
 * 3rd ed., §3.1, Theorems 3.1.1–3.1.2). The test runs the step-down (Schur-Cohn) recursion, the
 * Durbin-Levinson recursion backwards: the polynomial is stable iff every reflection coefficient has
 * modulus below 1 (Brockwell & Davis 2016 §2.5.3; Box, Jenkins, Reinsel & Ljung 2016, Appendix A3.1).
 * Reflection replaces each reciprocal root λ (a zero of z^p φ(1/z)) with |λ| > 1 by 1/λ̄, which leaves
 * the spectral shape, hence the Gaussian autocorrelations, unchanged (Brockwell & Davis 2016 §3.1,
 * remark after Theorem 3.1.2; R's `arima` applies the same step, `maInvert`, to MA parts).
 *
 * Conventions: roots by the Aberth-Ehrlich iteration, falling back to the eigenvalues of the
 * companion matrix (ml-matrix); reflected polynomials are rebuilt from their roots in complex
 * arithmetic and the (zero) imaginary parts dropped.
 *
 * @throws nothing: callers check the booleans.
 *
 * References: Brockwell & Davis (2016) §3.1; Box, Jenkins, Reinsel & Ljung (2016), Time Series
 * Analysis, 5th ed., §3.2 and Appendix A3.1; R `stats` arima.R (`maInvert`).
 */
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';

/** A complex number as [real, imaginary]. */
export type Complex = [number, number];

/**
 * True when φ(z) = 1 − Σ φ_i z^i has every zero strictly outside the unit circle, with a margin:
 * every reflection coefficient must satisfy |κ| < 1 − margin (margin 0 for the plain test).
 */
export function isStationary(ar: ArrayLike<number>, margin = 0): boolean {
  let k = ar.length;
  // Trailing zero coefficients do not change the zeros.
  while (k > 0 && ar[k - 1] === 0) k--;
  const a = new Float64Array(k);
  for (let i = 0; i < k; i++) a[i] = ar[i];
  for (; k >= 1; k--) {
    const kappa = a[k - 1];
    if (!Number.isFinite(kappa) || Math.abs(kappa) >= 1 - margin) return false;
    const scale = 1 - kappa * kappa;
    // In place: pairs (j, k − 2 − j) are updated together from their old values.
    for (let j = 0, l = k - 2; j <= l; j++, l--) {
      const aj = a[j];
      const al = a[l];
      a[j] = (aj + kappa * al) / scale;
      if (l !== j) a[l] = (al + kappa * aj) / scale;
    }
  }
  return true;
}

/** True when θ(z) = 1 + Σ θ_j z^j has every zero strictly outside the unit circle (see isStationary). */
export function isInvertible(ma: ArrayLike<number>, margin = 0): boolean {
  return isStationary(
    Array.from(ma, (theta) => -theta),
    margin,
  );
}

/**
 * The reciprocal roots λ_k of 1 − Σ c_i z^i, i.e. the zeros of λ^m − c_1 λ^{m−1} − … − c_m.
 * The model is stable iff every |λ_k| < 1.
 */
export function reciprocalRoots(c: ArrayLike<number>): Complex[] {
  const m = c.length;
  if (m === 0) return [];
  if (m === 1) return [[c[0], 0]];
  return aberthRoots(c) ?? companionEigenvalues(c);
}

/**
 * Zeros of λ^m − Σ c_i λ^{m−i} by the Aberth-Ehrlich simultaneous iteration (Aberth 1973, Math. Comp.
 * 27(122); cubic convergence to simple roots), from starting points on a circle of the Cauchy radius;
 * null when it does not settle within 500 sweeps. O(m²) per sweep: ~100× faster than the eigenvalues
 * of the companion matrix for the orders used here.
 */
function aberthRoots(c: ArrayLike<number>): Complex[] | null {
  const m = c.length;
  let radius = 0;
  for (let i = 0; i < m; i++) radius = Math.max(radius, Math.abs(c[i]) ** (1 / (i + 1)));
  radius = Math.max(radius, 1e-3);
  const re = new Float64Array(m);
  const im = new Float64Array(m);
  for (let k = 0; k < m; k++) {
    const angle = (2 * Math.PI * k) / m + 0.4;
    re[k] = radius * Math.cos(angle);
    im[k] = radius * Math.sin(angle);
  }
  for (let sweep = 0; sweep < 500; sweep++) {
    let largest = 0;
    for (let k = 0; k < m; k++) {
      // Horner for p(z) = z^m − c_1 z^{m−1} − … − c_m and p'(z).
      const zr = re[k];
      const zi = im[k];
      let pr = 1;
      let pi = 0;
      let dr = 0;
      let di = 0;
      for (let i = 0; i < m; i++) {
        const ndr = dr * zr - di * zi + pr;
        const ndi = dr * zi + di * zr + pi;
        dr = ndr;
        di = ndi;
        const npr = pr * zr - pi * zi - c[i];
        const npi = pr * zi + pi * zr;
        pr = npr;
        pi = npi;
      }
      // Newton ratio N = p/p', then the Aberth correction w = N / (1 − N Σ_{j≠k} 1/(z_k − z_j)).
      const dd = dr * dr + di * di;
      if (dd === 0) continue;
      const nr = (pr * dr + pi * di) / dd;
      const ni = (pi * dr - pr * di) / dd;
      let sr = 0;
      let si = 0;
      for (let j = 0; j < m; j++) {
        if (j === k) continue;
        const ar = zr - re[j];
        const ai = zi - im[j];
        const aa = ar * ar + ai * ai;
        if (aa === 0) continue;
        sr += ar / aa;
        si -= ai / aa;
      }
      const br = 1 - (nr * sr - ni * si);
      const bi = -(nr * si + ni * sr);
      const bb = br * br + bi * bi;
      if (bb === 0) continue;
      const wr = (nr * br + ni * bi) / bb;
      const wi = (ni * br - nr * bi) / bb;
      re[k] = zr - wr;
      im[k] = zi - wi;
      largest = Math.max(largest, Math.hypot(wr, wi) / Math.max(Math.hypot(re[k], im[k]), 1e-300));
    }
    if (!Number.isFinite(largest)) return null;
    if (largest < 1e-15) break;
    if (sweep === 499 && largest > 1e-10) return null;
  }
  return Array.from(re, (value, k): Complex => [value, im[k]]);
}

/** Eigenvalues of the companion matrix (ml-matrix), the fallback root finder. */
function companionEigenvalues(c: ArrayLike<number>): Complex[] {
  const m = c.length;
  const companion = Matrix.zeros(m, m);
  for (let j = 0; j < m; j++) companion.set(0, j, c[j]);
  for (let i = 1; i < m; i++) companion.set(i, i - 1, 1);
  const evd = new EigenvalueDecomposition(companion, { assumeSymmetric: false });
  return evd.realEigenvalues.map((re, k): Complex => [re, evd.imaginaryEigenvalues[k]]);
}

/** Coefficients c_1..c_m with 1 − Σ c_i z^i = Π (1 − λ_k z), from reciprocal roots λ_k. */
export function coefficientsFromReciprocalRoots(roots: Complex[]): number[] {
  // Expand Π (λ − λ_k) = λ^m + a_1 λ^{m−1} + … + a_m; then c_i = −a_i.
  let re = [1];
  let im = [0];
  for (const [lr, li] of roots) {
    const nextRe = new Array<number>(re.length + 1).fill(0);
    const nextIm = new Array<number>(re.length + 1).fill(0);
    for (let i = 0; i < re.length; i++) {
      nextRe[i] += re[i];
      nextIm[i] += im[i];
      nextRe[i + 1] -= re[i] * lr - im[i] * li;
      nextIm[i + 1] -= re[i] * li + im[i] * lr;
    }
    re = nextRe;
    im = nextIm;
  }
  return re.slice(1).map((a) => -a);
}

/**
 * Reflects every reciprocal root of 1 − Σ c_i z^i lying outside the unit circle to 1/λ̄.
 * Returns the new coefficients, or null when a root lies on the unit circle (within `onCircle`),
 * where reflection cannot help.
 */
export function reflectIntoStableRegion(c: ArrayLike<number>, onCircle = 1e-7): number[] | null {
  const roots = reciprocalRoots(c);
  let changed = false;
  for (const root of roots) {
    const modulus2 = root[0] * root[0] + root[1] * root[1];
    if (Math.abs(Math.sqrt(modulus2) - 1) <= onCircle) return null;
    if (modulus2 > 1) {
      // 1/λ̄ = λ/|λ|²: same argument, reciprocal modulus.
      root[0] = root[0] / modulus2;
      root[1] = root[1] / modulus2;
      changed = true;
    }
  }
  return changed ? coefficientsFromReciprocalRoots(roots) : Array.from(c);
}

/** AR coefficients with every explosive root reflected inside (see reflectIntoStableRegion). */
export function reflectAr(ar: ArrayLike<number>): number[] | null {
  return reflectIntoStableRegion(ar);
}

/** MA coefficients with every non-invertible root reflected (θ(z) = 1 + Σ θ_j z^j). */
export function reflectMa(ma: ArrayLike<number>): number[] | null {
  const reflected = reflectIntoStableRegion(Array.from(ma, (theta) => -theta));
  return reflected === null ? null : reflected.map((c) => -c);
}

/** c_i·r^i: scales every reciprocal root by r (0 < r < 1 pulls a unit root inside the circle). */
export function dampen(c: ArrayLike<number>, r: number): number[] {
  return Array.from(c, (value, i) => value * r ** (i + 1));
}

/**
 * A stable version of 1 − Σ c_i z^i for starting values: explosive roots reflected, roots on the
 * unit circle pulled inside by dampening with r = 0.98.
 */
export function stabilise(c: ArrayLike<number>): number[] {
  if (isStationary(c)) return Array.from(c);
  const reflected = reflectIntoStableRegion(c);
  if (reflected !== null && isStationary(reflected, 1e-6)) return reflected;
  let damped = reflected ?? Array.from(c);
  for (let tries = 0; tries < 200 && !isStationary(damped, 1e-6); tries++) damped = dampen(damped, 0.98);
  return isStationary(damped, 1e-6) ? damped : damped.map(() => 0);
}

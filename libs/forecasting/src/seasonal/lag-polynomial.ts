/**
 * Products of lag polynomials in the R `arima` sign convention: an AR part φ(B) = 1 − Σ φ_i B^i and an
 * MA part θ(B) = 1 + Σ θ_j B^j, each passed as its coefficient list without the leading 1.
 */

/** Multiplies two polynomials given by full coefficient lists (index = power of B). */
function multiply(a: ArrayLike<number>, b: ArrayLike<number>): Float64Array {
  const out = new Float64Array(a.length + b.length - 1);
  for (let i = 0; i < a.length; i++) for (let j = 0; j < b.length; j++) out[i + j] += a[i] * b[j];
  return out;
}

/** AR coefficients of φ(B)·(1 − B^lag): the differencing polynomial multiplied into the AR polynomial. */
export function arWithSeasonalDifference(ar: ArrayLike<number>, lag: number): number[] {
  const phi = [1, ...Array.from(ar, (c) => -c)];
  const delta = new Float64Array(lag + 1);
  delta[0] = 1;
  delta[lag] = -1;
  return Array.from(multiply(phi, delta).subarray(1), (c) => (c === 0 ? 0 : -c));
}

/** AR coefficients of φ(B)·Φ(B^s) (multiplicative seasonal AR, e.g. SARIMA's seasonal part). */
export function multiplyArPolynomials(ar: ArrayLike<number>, seasonalAr: ArrayLike<number>, period: number): number[] {
  const a = [1, ...Array.from(ar, (c) => -c)];
  const b = new Float64Array(seasonalAr.length * period + 1);
  b[0] = 1;
  for (let k = 0; k < seasonalAr.length; k++) b[(k + 1) * period] = -seasonalAr[k];
  return Array.from(multiply(a, b).subarray(1), (c) => (c === 0 ? 0 : -c));
}

/** MA coefficients of θ(B)·Θ(B^s) (expanding a seasonal MA, e.g. (1 + θ₁B)(1 + Θ₁B¹²)). */
export function multiplyMaPolynomials(ma: ArrayLike<number>, seasonalMa: ArrayLike<number>, period: number): number[] {
  const a = [1, ...Array.from(ma)];
  const b = new Float64Array(seasonalMa.length * period + 1);
  b[0] = 1;
  for (let k = 0; k < seasonalMa.length; k++) b[(k + 1) * period] = seasonalMa[k];
  return Array.from(multiply(a, b).subarray(1));
}

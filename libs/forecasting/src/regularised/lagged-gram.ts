/**
 * The Gram matrix G = ZᵀZ/m and c = Zᵀy/m of a standardised lagged design (lagged-design.ts) from the series
 * itself, without multiplying the columns pairwise.
 *
 * Method: every column is the same series shifted, so the raw cross-product of lags a and b,
 * S(a, b) = Σ_{t=M}^{n−1} x_{t−a} x_{t−b}, satisfies S(a+1, b+1) = S(a, b) + x_{M−1−a} x_{M−1−b} − x_{n−1−a} x_{n−1−b}
 * (the window slides by one row). Pairs with the same lag difference are walked up from the first one, which
 * is summed in full; the response is lag 0. Standardising afterwards, G_ij = (S_ij/m − μ_i μ_j)/(s_i s_j) with the
 * design's column means and scales, on the series centred at the response mean so that the subtraction loses
 * little (common practice for covariance updates). For lags 1–48 and 168 of a year of hours this takes about
 * 100 full sums instead of 1,225, the same numbers to rounding.
 * References: the lagged-product (autocovariance) identity, e.g. Brockwell & Davis (2016) §2.4.
 */
import type { LaggedDesign } from './lagged-design';

/** G (row-major k × k) and c of `design`, built from the series `x` it was made from. */
export function laggedGram(design: LaggedDesign, x: ArrayLike<number>): { gram: Float64Array; covariance: Float64Array } {
  const { lags, maxLag: start, rows: m, columnMeans, columnScales, responseMean } = design;
  const n = x.length;
  const k = lags.length;
  const centred = new Float64Array(n);
  for (let t = 0; t < n; t++) centred[t] = x[t] - responseMean;
  // Chains of raw cross-products by lag difference: the last smaller lag reached and its sum.
  const chains = new Map<number, { a: number; sum: number }>();
  const product = (a: number, b: number): number => {
    const difference = b - a;
    const chain = chains.get(difference);
    let sum: number;
    if (chain && chain.a <= a && a - chain.a < m) {
      sum = chain.sum;
      for (let s = chain.a; s < a; s++)
        sum += centred[start - 1 - s] * centred[start - 1 - s - difference] - centred[n - 1 - s] * centred[n - 1 - s - difference];
    } else {
      sum = 0;
      for (let t = start; t < n; t++) sum += centred[t - a] * centred[t - b];
    }
    chains.set(difference, { a, sum });
    return sum;
  };
  // Means of the centred columns (the response's is 0 by construction).
  const shifted = Float64Array.from(columnMeans, (mean) => mean - responseMean);
  const gram = new Float64Array(k * k);
  const covariance = new Float64Array(k);
  for (let i = 0; i < k; i++) covariance[i] = product(0, lags[i]) / m / columnScales[i];
  for (let i = 0; i < k; i++) {
    for (let j = i; j < k; j++) {
      const g = (product(lags[i], lags[j]) / m - shifted[i] * shifted[j]) / (columnScales[i] * columnScales[j]);
      gram[i * k + j] = g;
      gram[j * k + i] = g;
    }
  }
  return { gram, covariance };
}

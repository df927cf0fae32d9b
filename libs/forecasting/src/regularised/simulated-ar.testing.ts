/** Seeded AR simulation shared by the regularised specs (mulberry32 uniforms, Box-Muller normals). */
import { mulberry32 } from '../core/random';

/** Simulates x_t = mean + Σ coefficients[lag]·(x_{t−lag} − mean) + e_t, e_t ~ N(0, 1), after a burn-in of 500. */
export function simulateSparseAr(coefficients: Record<number, number>, n: number, seed: number, mean = 0): Float64Array {
  const uniform = mulberry32(seed);
  const normal = () => Math.sqrt(-2 * Math.log(1 - uniform())) * Math.cos(2 * Math.PI * uniform());
  const burn = 500;
  const total = new Float64Array(n + burn);
  for (let t = 0; t < total.length; t++) {
    let value = normal();
    for (const [lag, phi] of Object.entries(coefficients)) {
      const l = Number(lag);
      if (t - l >= 0) value += phi * total[t - l];
    }
    total[t] = value;
  }
  return total.subarray(burn).map((v) => v + mean);
}

/**
 * Seeded pseudo-random numbers and ARMA simulation for specs and benchmarks (not exported from the
 * library): the same seed always gives the same series, on every machine.
 *
 * Model simulated: (x_t − μ) = Σ φ_i (x_{t−i} − μ) + e_t + Σ θ_j e_{t−j}, e_t iid N(0, σ²)
 * (R's `arima` sign convention).
 *
 * Method: xoshiro128** (Blackman & Vigna 2021, ACM Trans. Math. Softw. 47(4)) seeded through
 * splitmix32 (common practice); uniforms with 53-bit resolution from two 32-bit outputs; normals by the
 * Box-Muller transform (Box & Muller 1958, Ann. Math. Stat. 29(2)).
 *
 * Conventions: the simulation starts from zero and discards `burnIn` values so the kept part is
 * (to rounding) a draw from the stationary process.
 *
 * @throws nothing.
 *
 * References: Blackman & Vigna (2021); Box & Muller (1958).
 */
import type { ArmaParameters } from '../core/types';

/** A seeded source of uniform and standard normal numbers. */
export interface SeededRandom {
  /** Uniform on [0, 1). */
  uniform(): number;
  /** Standard normal. */
  normal(): number;
}

/** A xoshiro128** generator seeded from a 32-bit integer. */
export function seededRandom(seed: number): SeededRandom {
  let s = seed >>> 0;
  const splitmix32 = (): number => {
    s = (s + 0x9e3779b9) >>> 0;
    let z = s;
    z = Math.imul(z ^ (z >>> 16), 0x85ebca6b) >>> 0;
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35) >>> 0;
    return (z ^ (z >>> 16)) >>> 0;
  };
  const state = new Uint32Array([splitmix32(), splitmix32(), splitmix32(), splitmix32()]);
  const next = (): number => {
    const result = Math.imul(rotl(Math.imul(state[1], 5) >>> 0, 7), 9) >>> 0;
    const t = (state[1] << 9) >>> 0;
    state[2] ^= state[0];
    state[3] ^= state[1];
    state[1] ^= state[2];
    state[0] ^= state[3];
    state[2] ^= t;
    state[3] = rotl(state[3], 11);
    return result;
  };
  let spare: number | null = null;
  const uniform = (): number => ((next() >>> 5) * 67108864 + (next() >>> 6)) / 9007199254740992;
  return {
    uniform,
    normal(): number {
      if (spare !== null) {
        const value = spare;
        spare = null;
        return value;
      }
      let u = uniform();
      while (u === 0) u = uniform();
      const radius = Math.sqrt(-2 * Math.log(u));
      const angle = 2 * Math.PI * uniform();
      spare = radius * Math.sin(angle);
      return radius * Math.cos(angle);
    },
  };
}

/** Rotates a 32-bit value left by k bits. */
function rotl(value: number, k: number): number {
  return ((value << k) | (value >>> (32 - k))) >>> 0;
}

/** n values of a Gaussian ARMA process with the given parameters, after `burnIn` discarded values. */
export function simulateArma(model: ArmaParameters, n: number, random: SeededRandom, burnIn = 500): Float64Array {
  const p = model.ar.length;
  const q = model.ma.length;
  const sigma = Math.sqrt(model.sigma2);
  const total = n + burnIn;
  const w = new Float64Array(total);
  const e = new Float64Array(total);
  for (let t = 0; t < total; t++) {
    e[t] = sigma * random.normal();
    let value = e[t];
    for (let i = 0; i < p && i < t; i++) value += model.ar[i] * w[t - 1 - i];
    for (let j = 0; j < q && j < t; j++) value += model.ma[j] * e[t - 1 - j];
    w[t] = value;
  }
  const x = new Float64Array(n);
  for (let t = 0; t < n; t++) x[t] = model.mean + w[burnIn + t];
  return x;
}

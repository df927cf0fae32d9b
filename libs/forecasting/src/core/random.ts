/**
 * Small deterministic pseudo-random generators for simulation tests and demo data.
 *
 * Uniforms from mulberry32 (a 32-bit multiply-xorshift generator, period 2³²) and standard normals
 * by the Box-Muller transform Z = sqrt(−2 log U₁)·cos(2πU₂), with its sine partner kept for the
 * next call.
 *
 * Method: Box & Muller (1958), Ann. Math. Stat. 29(2), 610–611; mulberry32 by T. Ettinger (2017,
 * public domain), a common choice for seeded reproducible streams in JavaScript (common practice).
 *
 * Conventions: the same seed gives the same stream on every platform; not for cryptography; U₁ is
 * drawn from (0, 1] so the logarithm is finite.
 *
 * References: Box & Muller (1958); Knuth (1997), The Art of Computer Programming, vol. 2, §3.4.1.
 */

/** A uniform generator on [0, 1) seeded by a 32-bit integer. */
export function mulberry32(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let z = state;
    z = Math.imul(z ^ (z >>> 15), z | 1);
    z ^= z + Math.imul(z ^ (z >>> 7), z | 61);
    return ((z ^ (z >>> 14)) >>> 0) / 4294967296;
  };
}

/** A standard normal generator (Box-Muller on mulberry32) seeded by a 32-bit integer. */
export function normalGenerator(seed: number): () => number {
  const uniform = mulberry32(seed);
  let spare: number | null = null;
  return () => {
    if (spare !== null) {
      const value = spare;
      spare = null;
      return value;
    }
    const radius = Math.sqrt(-2 * Math.log(1 - uniform()));
    const angle = 2 * Math.PI * uniform();
    spare = radius * Math.sin(angle);
    return radius * Math.cos(angle);
  };
}

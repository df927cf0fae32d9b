import { describe, expect, it } from 'vitest';
import lh from '../../../../fixtures/reference/ref/lh.json';
import { ForecastingError } from './errors';
import { normalCdf, normalQuantile } from './normal';

/** Relative difference, for tolerance checks that mean the same thing at every scale. */
const relative = (actual: number, expected: number) => Math.abs(actual - expected) / Math.abs(expected);

describe('normalQuantile', () => {
  it('matches the z values stored with R predict() intervals (fixtures/reference/ref/lh.json, forecasts.ar2_ml: z80 = qnorm(0.9), z95 = qnorm(0.975))', () => {
    // Stored to 15 significant digits, so 1e-14 relative is the most the file can confirm.
    expect(relative(normalQuantile(0.9), lh.forecasts.ar2_ml.z80)).toBeLessThan(1e-14);
    expect(relative(normalQuantile(0.975), lh.forecasts.ar2_ml.z95)).toBeLessThan(1e-14);
  });

  it('matches R 4.2.2 qnorm deep in the tails and near the centre (values printed with digits = 17 by Rscript)', () => {
    // Rscript -e 'print(c(qnorm(1e-300), qnorm(1e-10), qnorm(0.3), qnorm(0.5 + 1e-12)), digits = 17)'
    const cases: Array<[number, number]> = [
      [1e-300, -37.047096299361201],
      [1e-10, -6.3613409024040557],
      [0.3, -0.52440051270804067],
      [0.5 + 1e-12, 2.5065728237018611e-12],
    ];
    for (const [p, expected] of cases) expect(relative(normalQuantile(p), expected)).toBeLessThan(1e-13);
  });

  it('is antisymmetric about one half and inverts normalCdf', () => {
    // Dyadic p so that 1 − p is exact and the symmetry can be checked bit for bit.
    for (const p of [2 ** -30, 0.0078125, 0.125, 0.4375]) {
      expect(normalQuantile(1 - p)).toBe(-normalQuantile(p));
      expect(relative(normalCdf(normalQuantile(p)), p)).toBeLessThan(1e-14);
    }
    expect(normalQuantile(0.5)).toBe(0);
  });

  it('refuses probabilities outside (0, 1)', () => {
    for (const p of [0, 1, -0.1, 1.5, Number.NaN]) expect(() => normalQuantile(p)).toThrow(ForecastingError);
  });
});

describe('normalCdf', () => {
  it('matches R 4.2.2 pnorm with full relative accuracy in the lower tail', () => {
    // Rscript -e 'print(pnorm(c(-37, -8, -1, 0.5, 3)), digits = 17)'
    const cases: Array<[number, number]> = [
      [-37, 5.7255712225245771e-300],
      [-8, 6.2209605742717849e-16],
      [-1, 1.5865525393145705e-1],
      [0.5, 6.9146246127401301e-1],
      [3, 9.986501019683699e-1],
    ];
    for (const [x, expected] of cases) expect(relative(normalCdf(x), expected)).toBeLessThan(1e-13);
  });

  it('gives exactly one half at zero and the limits at infinity', () => {
    expect(normalCdf(0)).toBe(0.5);
    expect(normalCdf(-Infinity)).toBe(0);
    expect(normalCdf(Infinity)).toBe(1);
  });
});

import { describe, expect, it } from 'vitest';
import { coefficientRows } from './coefficients';

describe('coefficientRows', () => {
  it('lists mean, AR, MA and regression coefficients with their standard errors when recorded', () => {
    const { rows, zeroLags } = coefficientRows({
      mean: 410.2,
      ar: [0.81, -0.12],
      ma: [0.3],
      regression: { names: ['saturday', 'cooling degree-hours'], coefficients: [-12.5, 3.1], dropped: [] },
      standardErrors: { mean: 4.1, ar: [0.02, 0.021], ma: [0.05], regression: [1.5, 0.2] },
    });
    expect(rows).toEqual([
      { name: 'μ (mean)', value: 410.2, standardError: 4.1 },
      { name: 'φ₁ (AR lag 1)', value: 0.81, standardError: 0.02 },
      { name: 'φ₂ (AR lag 2)', value: -0.12, standardError: 0.021 },
      { name: 'θ₁ (MA lag 1)', value: 0.3, standardError: 0.05 },
      { name: 'β saturday', value: -12.5, standardError: 1.5 },
      { name: 'β cooling degree-hours', value: 3.1, standardError: 0.2 },
    ]);
    expect(zeroLags).toBe(0);
  });

  it('leaves out the lags a lasso benched, counting them, and has no standard errors when none were stored', () => {
    const ar = Array.from({ length: 168 }, (_, i) => (i === 0 ? 0.7 : i === 23 ? 0.1 : i === 167 ? 0.15 : 0));
    const { rows, zeroLags } = coefficientRows({ mean: 0, ar, ma: [] });
    expect(rows.map((r) => r.name)).toEqual(['μ (mean)', 'φ₁ (AR lag 1)', 'φ₂₄ (AR lag 24)', 'φ₁₆₈ (AR lag 168)']);
    expect(rows.every((r) => r.standardError === null)).toBe(true);
    expect(zeroLags).toBe(165);
  });

  it('reads a seasonal-naive fit as having no coefficients', () => {
    expect(coefficientRows({ seasonalNaive: { lag: 168 } })).toEqual({ rows: [], zeroLags: 0 });
  });
});

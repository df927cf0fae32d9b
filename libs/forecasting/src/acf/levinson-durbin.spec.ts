import { describe, expect, it } from 'vitest';
import { expectRelative, loadReference, loadSeries, referenceSeries } from '../core/spec-support';
import { autocovariance } from './autocovariance';
import { levinsonDurbin } from './levinson-durbin';

describe('levinsonDurbin', () => {
  // Source: fixtures/reference/ref/<series>.json, yule_walker[p].ar from 'ar.yw(x, aic = FALSE, order.max = p)' and
  // var_innov_levinson_plain = gamma(0)·prod(1 − phi_kk²), R 4.2.2, 15 significant digits; 1e-10 relative.
  for (const name of referenceSeries) {
    it(`solves the Yule-Walker equations as R ar.yw does on ${name} (p = 1, 2, 3)`, () => {
      const gamma = autocovariance(loadSeries(name), 3);
      const reference = loadReference(name).yule_walker;
      for (const p of [1, 2, 3]) {
        const result = levinsonDurbin(gamma, p);
        expectRelative(result.phi, reference[p].ar, 1e-10, `${name} AR(${p})`);
        expectRelative([result.variances[p]], [reference[p].var_innov_levinson_plain], 1e-10, `${name} v_${p}`);
      }
    });
  }

  it('returns a solution of Γ_p φ = γ_p and v_p = γ(0) − Σ φ_i γ(i) (Brockwell & Davis 2016, §2.5.3)', () => {
    const gamma = autocovariance(loadSeries('LakeHuron'), 5);
    const { phi, variances } = levinsonDurbin(gamma, 5);
    for (let i = 1; i <= 5; i++) {
      let lhs = 0;
      for (let j = 1; j <= 5; j++) lhs += phi[j - 1] * gamma[Math.abs(i - j)];
      expect(lhs).toBeCloseTo(gamma[i], 12);
    }
    const explained = phi.reduce((s, f, i) => s + f * gamma[i + 1], 0);
    expect(variances[5]).toBeCloseTo(gamma[0] - explained, 12);
  });

  it('refuses γ(0) = 0 and autocovariances that are not positive definite', () => {
    expect(() => levinsonDurbin([0, 0], 1)).toThrow(expect.objectContaining({ code: 'constant-series' }));
    expect(() => levinsonDurbin([1, 1.2], 1)).toThrow(expect.objectContaining({ code: 'non-stationary' }));
  });
});

import { describe, expect, it } from 'vitest';
import { autocorrelation } from '../acf/autocovariance';
import { yuleWalker } from '../ar/yule-walker';
import { expectRelative, loadReference, loadSeries } from '../core/spec-support';
import type { FitResult } from '../core/types';
import { residualDiagnostics } from './residual-diagnostics';

describe('residualDiagnostics', () => {
  it('reproduces R Box.test on the CSS ARMA(1,1) residuals of lh when handed them as a fit (fixtures/reference/ref/lh.json box_test.arma11_css.lag10)', () => {
    const stored = loadReference('lh').box_test.arma11_css;
    const residuals = Float64Array.from(stored.residuals as number[]);
    const fit = { ...yuleWalker(loadSeries('lh'), 1), p: 1, q: 1, residuals } as FitResult;
    const result = residualDiagnostics(fit, 10);
    expect(result.ljungBox.df).toBe(8);
    expectRelative([result.ljungBox.statistic, result.ljungBox.pValue], [stored.lag10.statistic, stored.lag10.p_value], 1e-10, 'Ljung-Box');
  });

  it('returns the residual ACF at lags 1..maxLag and the ±1.96/√n band', () => {
    const fit = yuleWalker(loadSeries('LakeHuron'), 2);
    const result = residualDiagnostics(fit, 12);
    expect(result.acf.length).toBe(12);
    expect(Array.from(result.acf)).toEqual(Array.from(autocorrelation(fit.residuals, 12).slice(1)));
    expect(result.band).toBeCloseTo(1.96 / Math.sqrt(98), 15);
    // An AR(2) leaves LakeHuron's residuals close to white noise (Brockwell & Davis 2016, Example 5.5.2): no large spikes.
    expect(Math.max(...Array.from(result.acf, Math.abs))).toBeLessThan(2 * result.band);
  });
});

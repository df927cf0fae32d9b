import { describe, expect, it } from 'vitest';
import { expectRelative, loadReference, loadSeries, referenceSeries } from '../core/spec-support';
import { autocorrelation } from './autocovariance';
import { partialAutocorrelation } from './pacf';

describe('partialAutocorrelation', () => {
  // Source: fixtures/reference/ref/<series>.json, acf.call_pacf = 'pacf(x, lag.max = 20, plot = FALSE)', R 4.2.2,
  // 15 significant digits. The recursion loses a few digits over 20 steps at most; 1e-10 relative.
  for (const name of referenceSeries) {
    it(`matches R pacf() on ${name} at lags 1..20`, () => {
      const reference = loadReference(name).acf;
      expectRelative(partialAutocorrelation(loadSeries(name), 20), reference.pacf, 1e-10, `${name} pacf`);
    });
  }

  it('equals r(1) at lag 1 and (r(2) − r(1)²)/(1 − r(1)²) at lag 2 (Brockwell & Davis 2016, §3.2.3)', () => {
    const x = loadSeries('lh');
    const r = autocorrelation(x, 2);
    const alpha = partialAutocorrelation(x, 2);
    expect(alpha[0]).toBeCloseTo(r[1], 15);
    expect(alpha[1]).toBeCloseTo((r[2] - r[1] ** 2) / (1 - r[1] ** 2), 14);
  });
});

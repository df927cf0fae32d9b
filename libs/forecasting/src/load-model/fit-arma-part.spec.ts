import { describe, expect, it } from 'vitest';
import { cmleAr } from '../ar/cmle';
import { yuleWalker } from '../ar/yule-walker';
import { nlsArma } from '../arma/nls';
import { lassoAr } from '../regularised/lasso';
import { ridgeAr } from '../regularised/ridge';
import { fitArmaPart } from './fit-arma-part';
import { seededNormal } from './synthetic-load.testing';

// An AR(2) with a lag-24 term, seeded: x_t = 0.5 x_{t−1} + 0.2 x_{t−2} + 0.3 x_{t−24} + e_t.
const normal = seededNormal(8);
const x = new Float64Array(3000);
for (let t = 0; t < x.length; t++)
  x[t] = normal() + (t >= 1 ? 0.5 * x[t - 1] : 0) + (t >= 2 ? 0.2 * x[t - 2] : 0) + (t >= 24 ? 0.3 * x[t - 24] : 0);

describe('fitArmaPart dispatches to the estimators', () => {
  it('calls each estimator with the spec orders', () => {
    expect(fitArmaPart({ method: 'yule-walker', p: 3, q: 0 }, x).ar).toEqual(yuleWalker(x, 3).ar);
    expect(fitArmaPart({ method: 'cmle', p: 3, q: 0 }, x).ar).toEqual(cmleAr(x, 3).ar);
    expect(fitArmaPart({ method: 'nls', p: 1, q: 1 }, x).ma).toEqual(nlsArma(x, 1, 1).ma);
    expect(fitArmaPart({ method: 'ridge', p: 0, q: 0, lags: [1, 2, 24], lambda: 1 }, x).ar).toEqual(
      ridgeAr(x, { lags: [1, 2, 24], lambda: 1 }).ar,
    );
    expect(fitArmaPart({ method: 'lasso', p: 0, q: 0, lags: [1, 2, 3, 24] }, x).ar).toEqual(
      lassoAr(x, { lags: [1, 2, 3, 24], select: 'bic' }).ar,
    );
  });

  it('defaults ridge and lasso to lags 1..p', () => {
    expect(fitArmaPart({ method: 'ridge', p: 2, q: 0, lambda: 0.5 }, x).ar).toEqual(ridgeAr(x, { lags: [1, 2], lambda: 0.5 }).ar);
  });

  it('refuses MA terms with AR-only methods', () => {
    expect(() => fitArmaPart({ method: 'cmle', p: 1, q: 1 }, x)).toThrow(/q = 0/);
  });
});
